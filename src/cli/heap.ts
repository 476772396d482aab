/**
 * V8 heap sizing for the engine's runs. With its default limits V8 keeps the old generation's
 * allocation limit close to the live heap of a small program (some 20 MB here), and a sweep —
 * which allocates steadily, mostly short-lived matrices — then runs a full mark-compact about every
 * quarter second: 40 in a 300-point run at M = 15, on background threads, costing about 0.07 of a
 * core per thread next to the solve. An initial old-space limit of 128 MB leaves 5. The heap still
 * grows only as needed (memory in use is unchanged); the limit only decides when to collect.
 *
 * The flag must be given to node for the main thread (the `furrow` command's first line, the npm
 * scripts); set here as well it applies to every worker thread started afterwards.
 */
import { setFlagsFromString } from 'node:v8';

/** The node flags the `furrow` command runs with (also on its first line and in package.json). */
export const HEAP_FLAGS: readonly string[] = ['--initial-old-space-size=128'];

/** Apply HEAP_FLAGS to worker threads started from now on (their heaps are configured at start). */
export function tuneHeapForWorkers(): void {
  for (const f of HEAP_FLAGS) setFlagsFromString(f);
}
