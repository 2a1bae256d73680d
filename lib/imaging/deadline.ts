/**
 * Time limits for measuring. A deadline is an epoch-ms instant; hot loops call the check that
 * `deadlineCheck` returns, which reads the clock only every 1 024 calls, so the check costs
 * nothing next to the loop body and a runaway input stops within a few milliseconds of its time.
 */

/** Thrown when measuring runs past its deadline (an inline measurement then goes to the job queue). */
export class DeadlineExceeded extends Error {
  constructor() {
    super("The measurement did not finish within its time budget.");
    this.name = "DeadlineExceeded";
  }
}

const CALLS_PER_CLOCK_READ = 1024;

/** A function to call inside loops: throws DeadlineExceeded once `deadline` has passed (never without one). */
export function deadlineCheck(deadline: number | undefined): () => void {
  if (deadline === undefined) return () => {};
  let calls = 0;
  return () => {
    if (++calls % CALLS_PER_CLOCK_READ === 0 && Date.now() > deadline) throw new DeadlineExceeded();
  };
}

/** Throws DeadlineExceeded now if `deadline` has passed (between larger steps). */
export function assertBeforeDeadline(deadline: number | undefined): void {
  if (deadline !== undefined && Date.now() > deadline) throw new DeadlineExceeded();
}
