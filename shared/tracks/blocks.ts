/**
 * Points per call of the analysis's per-point loops (issue 19, session 9).
 *
 * A long run's first analysis in a process used to run most of its loops in V8's unoptimised tiers: each
 * loop sat in a function called once per analysis, so the warm-up on a short run only marked it for
 * optimisation, and the long run paid for the compile (concurrently, on the machine's other core) while
 * its loop ran slowly and boxed every number it computed (tests/bench/README.md, "Session 9: the first
 * analysis in a process"). Run in blocks of this many points, each loop's function is called a few times
 * during a one-hour run (3 600 points at 1 s), so it is compiled before the long run comes.
 *
 * Every block function does the same operations in the same order as the single loop it replaces and
 * carries what the loop carried (sums, pointers, the last value seen) from one block to the next, so the
 * results are the same bits (tests/unit/shared/tracks/analysis-snapshot.test.ts).
 */
export const BLOCK = 512;
