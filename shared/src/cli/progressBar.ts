/// <reference types="node" />
import type { PoolProgress } from './mapPool.js';

/** Seconds as "0.8 s", "42 s", "3 min 05 s". */
export function formatSeconds(s: number): string {
  if (!Number.isFinite(s) || s < 0) return '?';
  if (s < 10) return `${s.toFixed(1)} s`;
  if (s < 60) return `${Math.round(s)} s`;
  const m = Math.floor(s / 60);
  return `${m} min ${String(Math.round(s - 60 * m)).padStart(2, '0')} s`;
}

const STAGE_WORDS: Record<PoolProgress['stage'], string> = {
  models: 'building orbital models',
  cells: 'filling and classifying cells',
};

/**
 * One progress line: stage, bar, percentage, count, elapsed time and an estimate of the time left
 * in this stage (from its own rate so far).
 *
 * @example
 * progressLine({ stage: 'cells', done: 500, total: 1000 }, 4, 2, 30) // 'cells  [###############...............]  50%  500/1000 cells  elapsed 4.0 s  left 2.0 s'
 */
export function progressLine(p: PoolProgress, elapsedS: number, stageElapsedS: number, width = 30): string {
  const f = p.total > 0 ? Math.min(1, p.done / p.total) : 0;
  const filled = Math.round(f * width);
  const left = f > 0 ? (stageElapsedS * (1 - f)) / f : NaN;
  const count = p.stage === 'cells' ? `  ${p.done}/${p.total} cells` : '';
  return (
    `${p.stage === 'cells' ? 'cells ' : 'models'} [${'#'.repeat(filled)}${'.'.repeat(width - filled)}] ${String(Math.floor(f * 100)).padStart(3)}%` +
    `${count}  elapsed ${formatSeconds(elapsedS)}  left ${f > 0 ? formatSeconds(left) : '?'}`
  );
}

/**
 * Progress on stderr: a bar redrawn in place (at most 10 times a second) when stderr is a terminal,
 * otherwise a plain line at each stage start, each further 10 % and the end.
 */
export class ProgressReporter {
  private readonly t0 = Date.now();
  private stage: PoolProgress['stage'] | null = null;
  private stageT0 = Date.now();
  private lastDraw = 0;
  private lastDecile = -1;
  private drawn = false;

  constructor(
    private readonly stream: NodeJS.WriteStream,
    private readonly tty = Boolean(stream.isTTY),
  ) {}

  update(p: PoolProgress): void {
    const now = Date.now();
    if (p.stage !== this.stage) {
      if (this.stage !== null && this.tty && this.drawn) this.stream.write('\n');
      this.stage = p.stage;
      this.stageT0 = now;
      this.lastDecile = -1;
      this.drawn = false;
      if (!this.tty) this.stream.write(`fieldbound map: ${STAGE_WORDS[p.stage]}\n`);
    }
    const line = progressLine(p, (now - this.t0) / 1000, (now - this.stageT0) / 1000);
    const complete = p.done >= p.total;
    if (this.tty) {
      if (!complete && now - this.lastDraw < 100) return;
      this.lastDraw = now;
      this.stream.write(`\r${line}\x1b[K`);
      this.drawn = true;
    } else {
      const decile = Math.floor((10 * p.done) / Math.max(1, p.total));
      if (decile === this.lastDecile) return;
      this.lastDecile = decile;
      this.stream.write(`fieldbound map: ${line}\n`);
    }
  }

  /** Ends the bar's line (terminal only). */
  finish(): void {
    if (this.tty && this.drawn) this.stream.write('\n');
    this.drawn = false;
  }
}
