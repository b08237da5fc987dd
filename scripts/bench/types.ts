/**
 * Shape shared by the benchmark modules under scripts/bench/ (production.ts, money.ts).
 * scripts/bench.ts imports each module's `cases`, times `run()` repeatedly and prints the
 * median, p95 and best time beside the goal.
 */
export type BenchCase = {
  /** Short label printed in the table, e.g. "production: 3 faces, 8760 h". */
  name: string;
  /** Human-readable target, e.g. "≤ 10 ms median". Printed beside the measured figures. */
  goal?: string;
  /** Optional goal as a number (ms, median) so the runner can mark pass/miss. */
  goalMedianMs?: number;
  /** The work to time. Its return value is kept alive so the work is not optimised away. */
  run: () => unknown;
  /** Optional one-off set-up, run once before timing (not timed). */
  setup?: () => void | Promise<void>;
};

/** What each bench module exports. */
export type BenchModule = { cases: BenchCase[] };
