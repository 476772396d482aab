#!/usr/bin/env python3
"""A plain numpy rigorous coupled-wave solver for the classical mount, for scripts/bench-solver.ts.

It is written independently of Furrow's TypeScript solver, to check its efficiencies and to time
it against a straightforward implementation on top of LAPACK (numpy.linalg.eig and solve).

Method
------
Rigorous coupled-wave analysis of a lamellar multi-layer grating (TE and TM, plane of incidence
normal to the grooves), with the enhanced transmittance-matrix recursion of Moharam, Grann,
Pommet & Gaylord, J. Opt. Soc. Am. A 12, 1068 (1995), and for TM the inverse rule of Li,
J. Opt. Soc. Am. A 13, 1870 (1996) / Lalanne & Morris, J. Opt. Soc. Am. A 13, 779 (1996):
the product involving Ex (normal to the vertical walls) uses [[1/eps]]^-1, the one involving Ez
(tangential) uses [[eps]].

Conventions (Furrow's): time dependence exp(-i w t); complex index n + i kappa (kappa >= 0
absorbs), eps = index^2; period along x, light from the cover (z < 0) toward +z; layers top to
bottom; lengths in micrometres, angles in degrees; kx_m = k0 (n_c sin(theta) + m lambda / period)
for the orders m = -M..M; efficiency = z-flux of the order over the incident z-flux.

With z' = k0 z and H' = Z0 H, Maxwell's equations read curl E = i H', curl H' = -i eps E.
  TE (Ey, Hx):  dEy/dz' = -i Hx,          dHx/dz' = i (Kx^2 - [[eps]]) Ey
                -> d2Ey/dz'2 = -(E - Kx^2) Ey.                       Ey modes W, Hx = -W q
  TM (Hy, Ex):  dHy/dz' = i [[1/eps]]^-1 Ex,  dEx/dz' = i (I - Kx [[eps]]^-1 Kx) Hy
                -> d2Hy/dz'2 = -A^-1 B Hy, A = [[1/eps]], B = I - Kx E^-1 Kx.
                                                                     Hy modes W, Ex = A W q
A mode exp(+i q z') (Im q >= 0) is "forward" and has tangential fields (W, V); the backward one
(W, -V). In a homogeneous medium W = I and V = Y = -kz (TE) or kz / eps (TM).

Input (stdin, JSON):
  {"structure": {periodUm, cover, substrate, layers: [{thicknessUm, profile}]},   # as Furrow's
   "incidence": {"wavelengthUm", "thetaDeg"},
   "M": 50, "polarization": "TE" | "TM", "repeats": 15, "time": true, "hermitian": false}
  Profiles: {"kind": "uniform", "index"} or {"kind": "segments", "segments": [{from, to, index}]},
  indices as {"re", "im"}.
Output (stdout, JSON): efficiencies of every order in both polarizations ("TE", "TM": orders,
reflected, transmitted, propagating flags, R, T), so the caller can compare with Furrow's s and p
responses; with "time": the median ms per solve of the requested polarization alone ("pol_ms"),
of TE and TM together ("both_ms"), and the part of the first spent in the eigensolver
("eig_ms"). The eigensolver is numpy.linalg.eig on every layer; with "hermitian": true and a
layer of real eps(x), the same outputs are also given under "hermitian" for a variant that uses
numpy.linalg.eigh on such layers.

Exit status 3 with a message on stderr when numpy is missing. Run single-threaded to compare
with one JavaScript thread (OMP_NUM_THREADS=1 OPENBLAS_NUM_THREADS=1, and OPENBLAS_CORETYPE /
OPENBLAS_L2_SIZE unset; bench-solver.ts does this).
"""
import json
import os
import sys
import time

try:
    import numpy as np
except ImportError:
    print("numpy is not installed", file=sys.stderr)
    sys.exit(3)


def cindex(c):
    return complex(c["re"], c["im"])


def fourier_coefficients(profile, nmax, inverse):
    """Coefficients c_k, k = -nmax..nmax, of eps(x) (or 1/eps(x)), exact for segments."""
    k = np.arange(-nmax, nmax + 1)
    out = np.zeros(2 * nmax + 1, dtype=complex)
    if profile["kind"] == "uniform":
        segments = [{"from": 0.0, "to": 1.0, "index": profile["index"]}]
    elif profile["kind"] == "segments":
        segments = profile["segments"]
    else:
        raise ValueError(f"profile kind {profile['kind']!r} is not supported here (lamellar stacks only)")
    nz = k != 0
    w = 2 * np.pi * k[nz]
    for seg in segments:
        eps = cindex(seg["index"]) ** 2
        v = 1 / eps if inverse else eps
        a, b = seg["from"], seg["to"]
        # (1/period) * integral over [a, b) of v exp(-i 2 pi k x) dx, in fractions of the period
        out[~nz] += v * (b - a)
        out[nz] += v * (np.exp(-1j * w * a) - np.exp(-1j * w * b)) / (1j * w)
    return out


def toeplitz_from(coeffs, n):
    """T[i, j] = c_(i - j) with coeffs[k + n - 1] = c_k."""
    idx = np.arange(n)[:, None] - np.arange(n)[None, :] + (n - 1)
    return coeffs[idx]


def kz_of(eps, kx):
    """kz / k0 = sqrt(eps - kx^2) on the branch Im >= 0 (outgoing or decaying)."""
    kz = np.sqrt(eps - kx.astype(complex) ** 2)
    return np.where(kz.imag < 0, -kz, kz)


def is_lossless(profile):
    segments = [{"index": profile["index"]}] if profile["kind"] == "uniform" else profile["segments"]
    return all(cindex(seg["index"]).imag == 0 for seg in segments)


def layer_modes(profile, kx, pol, timer, hermitian=False):
    """W, V and q of one layer (dense even when the layer is homogeneous: plain and general).

    hermitian: for a layer whose eps(x) is real, use numpy.linalg.eigh — TE: E - Kx^2 is
    Hermitian; TM: A^-1 B w = q^2 w is the Hermitian-definite pencil B w = q^2 A w (A = [[1/eps]]
    positive definite), reduced with A = L L^H to (L^-1 B L^-H) y = q^2 y, w = L^-H y.
    """
    n = kx.size
    E = toeplitz_from(fourier_coefficients(profile, n - 1, False), n)
    Kx = np.diag(kx.astype(complex))
    herm = hermitian and is_lossless(profile)
    if pol == "TE":
        omega = E - Kx @ Kx
        t0 = time.perf_counter()
        if herm:
            lam, W = np.linalg.eigh(omega)
        else:
            lam, W = np.linalg.eig(omega)
        timer[0] += time.perf_counter() - t0
    else:
        A = toeplitz_from(fourier_coefficients(profile, n - 1, True), n)
        B = np.eye(n) - Kx @ np.linalg.solve(E, Kx)
        if herm:
            L = np.linalg.cholesky(A)
            C = np.linalg.solve(L, B)  # L^-1 B
            H = np.linalg.solve(L, C.conj().T).conj().T  # L^-1 B L^-H (B Hermitian)
            H = 0.5 * (H + H.conj().T)
            t0 = time.perf_counter()
            lam, Y = np.linalg.eigh(H)
            timer[0] += time.perf_counter() - t0
            W = np.linalg.solve(L.conj().T, Y)
        else:
            omega = np.linalg.solve(A, B)
            t0 = time.perf_counter()
            lam, W = np.linalg.eig(omega)
            timer[0] += time.perf_counter() - t0
    q = np.sqrt(lam.astype(complex))
    # Im q >= 0; a real q keeps its principal (positive) sign
    q = np.where(q.imag < -1e-12 * np.abs(q), -q, q)
    if pol == "TE":
        V = -W * q[None, :]
    else:
        V = A @ (W * q[None, :])
    return W, V, q


def solve_pol(structure, incidence, M, pol, timer=None, hermitian=False):
    """Reflected and transmitted amplitudes and efficiencies of every order, one polarization."""
    if timer is None:
        timer = [0.0]
    lam = incidence["wavelengthUm"]
    theta = np.deg2rad(incidence["thetaDeg"])
    k0 = 2 * np.pi / lam
    period = structure["periodUm"]
    nc = cindex(structure["cover"])
    ns = cindex(structure["substrate"])
    eps_c, eps_s = nc**2, ns**2
    m = np.arange(-M, M + 1)
    n = m.size
    kx = nc.real * np.sin(theta) + m * lam / period
    kz_c = kz_of(eps_c, kx)
    kz_s = kz_of(eps_s, kx)
    # V of the homogeneous half-spaces (forward waves): Hx = -kz Ey (TE), Ex = kz/eps Hy (TM)
    y_c = -kz_c if pol == "TE" else kz_c / eps_c
    y_s = -kz_s if pol == "TE" else kz_s / eps_s
    identity = np.eye(n, dtype=complex)

    # enhanced transmittance matrices, from the substrate up: the tangential field at the bottom
    # of layer l is [f; g] T_(l+1); [W, W; V, -V]^-1 [f; g] = [a; b] and c- = b a^-1 X c+
    f = identity.copy()
    g = np.diag(y_s)
    down = []  # a_l^-1 X_l, applied top to bottom afterwards: T_(l+1) = a_l^-1 X_l T_l
    for layer in reversed(structure["layers"]):
        W, V, q = layer_modes(layer["profile"], kx, pol, timer, hermitian)
        X = np.exp(1j * q * k0 * layer["thicknessUm"])
        Wf = np.linalg.solve(W, f)
        Vg = np.linalg.solve(V, g)
        a = 0.5 * (Wf + Vg)
        b = 0.5 * (Wf - Vg)
        aiX = np.linalg.solve(a, np.diag(X))
        XbaX = X[:, None] * (b @ aiX)
        f = W @ (identity + XbaX)
        g = V @ (identity - XbaX)
        down.append(aiX)
    # cover: [I; Y_c] delta + [I; -Y_c] r = [f; g] T_1
    delta = np.zeros(n, dtype=complex)
    delta[M] = 1
    lhs = np.block([[-identity, f], [np.diag(y_c), g]])
    rhs = np.concatenate([delta, y_c * delta])
    sol = np.linalg.solve(lhs, rhs)
    r = sol[:n]
    t = sol[n:]
    for aiX in reversed(down):
        t = aiX @ t
    # z-flux of a wave of amplitude u in a homogeneous medium: +-1/2 |u|^2 Re(s kz), s = 1 (TE) or 1/eps (TM)
    s_c = 1.0 if pol == "TE" else 1 / eps_c
    s_s = 1.0 if pol == "TE" else 1 / eps_s
    incident = (s_c * kz_c[M]).real
    eff_r = np.abs(r) ** 2 * (s_c * kz_c).real / incident
    eff_t = np.abs(t) ** 2 * (s_s * kz_s).real / incident
    return {
        "orders": m.tolist(),
        "reflected": eff_r.tolist(),
        "transmitted": eff_t.tolist(),
        # propagating: real kz in a lossless medium; |kx| < Re(index) in an absorbing one
        "propagating_reflected": (np.abs(kx) < nc.real).tolist(),
        "propagating_transmitted": (np.abs(kx) < ns.real).tolist(),
        "R": float(eff_r.sum()),
        "T": float(eff_t.sum()),
    }


def median_ms(fn, repeats):
    """Warm-up (3 calls and 50 ms at least), then the median of `repeats` timed calls."""
    start = time.perf_counter()
    calls = 0
    while calls < 3 or time.perf_counter() - start < 0.05:
        fn()
        calls += 1
    samples = []
    for _ in range(repeats):
        t0 = time.perf_counter()
        fn()
        samples.append(time.perf_counter() - t0)
    samples.sort()
    return 1e3 * samples[len(samples) // 2]


def openblas_kernel():
    """Which OpenBLAS kernel numpy's bundled library runs (None when it cannot be asked)."""
    import ctypes
    import glob

    for path in glob.glob(os.path.join(os.path.dirname(np.__file__), "..", "numpy.libs", "*openblas*")):
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


def blas_info():
    info = {"numpy": np.__version__, "threads": os.environ.get("OPENBLAS_NUM_THREADS", "unset")}
    try:
        from threadpoolctl import threadpool_info

        info["blas"] = [
            {k: p.get(k) for k in ("internal_api", "version", "architecture", "num_threads")} for p in threadpool_info()
        ]
    except ImportError:
        info["blas"] = openblas_kernel() or "kernel not reported"
    return info


def timings(structure, incidence, M, pol, repeats, hermitian):
    """Median ms of one polarization, of both, and eig's (or eigh's) share of the first."""
    out = {
        "pol_ms": median_ms(lambda: solve_pol(structure, incidence, M, pol, hermitian=hermitian), repeats),
        "both_ms": median_ms(
            lambda: (
                solve_pol(structure, incidence, M, "TE", hermitian=hermitian),
                solve_pol(structure, incidence, M, "TM", hermitian=hermitian),
            ),
            repeats,
        ),
    }
    shares = []
    for _ in range(repeats):
        timer = [0.0]
        solve_pol(structure, incidence, M, pol, timer, hermitian)
        shares.append(timer[0])
    shares.sort()
    out["eig_ms"] = 1e3 * shares[len(shares) // 2]
    return out


def main():
    case = json.load(sys.stdin)
    structure = case["structure"]
    incidence = case["incidence"]
    M = int(case["M"])
    pol = case.get("polarization", "TE")
    if pol not in ("TE", "TM"):
        raise ValueError(f"polarization must be 'TE' or 'TM', got {pol!r}")
    if incidence.get("phiDeg", 0):
        raise ValueError("only the classical mount (phiDeg = 0) is implemented here")
    out = {
        "info": blas_info(),
        "TE": solve_pol(structure, incidence, M, "TE"),
        "TM": solve_pol(structure, incidence, M, "TM"),
    }
    repeats = int(case.get("repeats", 15))
    timing = case.get("time", True)
    if timing:
        out.update(timings(structure, incidence, M, pol, repeats, False))
    if case.get("hermitian", False) and any(is_lossless(layer["profile"]) for layer in structure["layers"]):
        herm = {
            "TE": solve_pol(structure, incidence, M, "TE", hermitian=True),
            "TM": solve_pol(structure, incidence, M, "TM", hermitian=True),
        }
        if timing:
            herm.update(timings(structure, incidence, M, pol, repeats, True))
        out["hermitian"] = herm
    print(json.dumps(out))


if __name__ == "__main__":
    main()
