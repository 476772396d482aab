#!/usr/bin/env python3
"""Reference timings of the dense complex kernels in numpy, for scripts/bench-linalg.ts.

Times a @ b, numpy.linalg.solve (n right-hand sides), eig and eigh on complex128 matrices and
prints one JSON object per line: {"kernel": "zgemm", "n": 101, "median_ms": 0.15}. The first
line describes the numpy build: {"info": {...}}.

Run it single-threaded to compare with one JavaScript thread: bench-linalg.ts starts it with
OMP_NUM_THREADS=1 OPENBLAS_NUM_THREADS=1 and without OPENBLAS_CORETYPE / OPENBLAS_L2_SIZE (which
would pin OpenBLAS to an older, slower kernel). Timing follows bench-linalg.ts: each sample
runs enough calls to last about a millisecond; the median sample over the call count is
reported.

Exit status 3 with a message on stderr when numpy is missing.
"""
import argparse
import json
import os
import sys
import time

try:
    import numpy as np
except ImportError:
    print("numpy is not installed", file=sys.stderr)
    sys.exit(3)


def blas_info():
    info = {"numpy": np.__version__, "threads": os.environ.get("OPENBLAS_NUM_THREADS", "unset")}
    try:
        from threadpoolctl import threadpool_info  # optional: says which OpenBLAS kernel runs

        pools = threadpool_info()
        info["blas"] = [
            {k: p.get(k) for k in ("internal_api", "version", "architecture", "num_threads")} for p in pools
        ]
    except ImportError:
        info["blas"] = openblas_corename() or "threadpoolctl not installed (kernel architecture not reported)"
    return info


def openblas_corename():
    """Name of the OpenBLAS kernel in use, read from the library numpy bundles (or None)."""
    import ctypes
    import glob

    libdir = os.path.join(os.path.dirname(np.__file__), "..", "numpy.libs")
    for path in glob.glob(os.path.join(libdir, "*openblas*")):
        try:
            lib = ctypes.CDLL(path)
        except OSError:
            continue
        for name in ("scipy_openblas_get_corename64_", "scipy_openblas_get_corename", "openblas_get_corename"):
            fn = getattr(lib, name, None)
            if fn is not None:
                fn.restype = ctypes.c_char_p
                return "OpenBLAS kernel " + fn().decode()
    return None


def median_ms(fn, repeats):
    # warm-up as in bench-linalg.ts: at least 3 calls and 50 ms
    start = time.perf_counter()
    calls = 0
    while calls < 3 or time.perf_counter() - start < 0.05:
        fn()
        calls += 1
    # calls per sample so a sample lasts about 1 ms (timer resolution and call overhead)
    t0 = time.perf_counter()
    fn()
    once = max(time.perf_counter() - t0, 1e-7)
    inner = max(1, int(1e-3 / once))
    samples = []
    for _ in range(repeats):
        t0 = time.perf_counter()
        for _ in range(inner):
            fn()
        samples.append((time.perf_counter() - t0) / inner)
    samples.sort()
    return 1e3 * samples[len(samples) // 2]


def random_complex(rng, n):
    return (2 * rng.random((n, n)) - 1) + 1j * (2 * rng.random((n, n)) - 1)


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument("--sizes", default="21,51,101,201")
    parser.add_argument("--repeats", type=int, default=15)
    parser.add_argument("--kernels", default="zgemm,zgesv,zgeev,zheev")
    args = parser.parse_args()
    sizes = [int(s) for s in args.sizes.split(",") if s]
    kernels = [k for k in args.kernels.split(",") if k]
    print(json.dumps({"info": blas_info()}), flush=True)
    rng = np.random.default_rng(20240601)
    for n in sizes:
        a = random_complex(rng, n)
        b = random_complex(rng, n)
        h = 0.5 * (a + a.conj().T)
        cases = {
            "zgemm": lambda: a @ b,
            "zgesv": lambda: np.linalg.solve(a, b),
            "zgeev": lambda: np.linalg.eig(a),
            "zheev": lambda: np.linalg.eigh(h),
        }
        for kernel in kernels:
            ms = median_ms(cases[kernel], args.repeats)
            print(json.dumps({"kernel": kernel, "n": n, "median_ms": round(ms, 6)}), flush=True)


if __name__ == "__main__":
    main()
