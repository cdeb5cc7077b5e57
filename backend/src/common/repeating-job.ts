import type { Logger } from '@nestjs/common';

/**
 * Runs `job` now and then every `intervalMs` (the timer does not keep the process alive); a failure is
 * logged as `{ event: failureEvent, error }` and the next round runs as planned. Returns the stop function.
 */
export function startRepeatingJob(job: () => Promise<unknown>, intervalMs: number, logger: Logger, failureEvent: string): () => void {
  const run = () => void job().catch((error: unknown) => logger.warn({ event: failureEvent, error: (error as Error).message }));
  const timer = setInterval(run, intervalMs);
  timer.unref();
  run();
  return () => clearInterval(timer);
}
