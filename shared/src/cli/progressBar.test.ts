/** The progress output of `fieldbound map`: a bar redrawn in place on a terminal, plain lines otherwise. */
import { describe, expect, it } from 'vitest';
import { formatSeconds, ProgressReporter, progressLine } from './progressBar.js';

function fakeStream(): { stream: NodeJS.WriteStream; text: () => string } {
  let buf = '';
  const stream = { write: (s: string) => ((buf += s), true) } as unknown as NodeJS.WriteStream;
  return { stream, text: () => buf };
}

describe('progress output', () => {
  it('a line shows the bar, the percentage, the cells, the elapsed time and the time left from the stage rate', () => {
    expect(progressLine({ stage: 'cells', done: 500, total: 1000 }, 4, 2, 10)).toBe('cells  [#####.....]  50%  500/1000 cells  elapsed 4.0 s  left 2.0 s');
    expect(progressLine({ stage: 'models', done: 0, total: 8 }, 0.5, 0.5, 4)).toBe('models [....]   0%  elapsed 0.5 s  left ?');
    expect(formatSeconds(42.4)).toBe('42 s');
    expect(formatSeconds(185)).toBe('3 min 05 s');
  });

  it('on a terminal the bar is redrawn in place (carriage return) and ends with a newline; 100 % is always drawn', () => {
    const f = fakeStream();
    const p = new ProgressReporter(f.stream, true);
    p.update({ stage: 'models', done: 1, total: 4 });
    p.update({ stage: 'models', done: 2, total: 4 }); // within 100 ms: skipped
    p.update({ stage: 'models', done: 4, total: 4 });
    p.update({ stage: 'cells', done: 10, total: 10 });
    p.finish();
    const t = f.text();
    expect(t.startsWith('\rmodels [')).toBe(true);
    expect(t).not.toContain(' 50%');
    expect(t).toMatch(/\rmodels \[#+\] 100%  elapsed/);
    expect(t).toMatch(/\n\rcells  \[#+\] 100%  10\/10 cells/);
    expect(t.endsWith('\n')).toBe(true);
  });

  it('without a terminal: a plain line when each stage starts and at each further 10 %, no carriage returns', () => {
    const f = fakeStream();
    const p = new ProgressReporter(f.stream, false);
    for (let d = 0; d <= 1000; d += 25) p.update({ stage: 'cells', done: d, total: 1000 });
    p.finish();
    const lines = f.text().trimEnd().split('\n');
    expect(f.text()).not.toContain('\r');
    expect(lines[0]).toBe('fieldbound map: filling and classifying cells');
    expect(lines.length).toBe(1 + 11); // 0 %, 10 %, …, 100 %
    expect(lines.at(-1)).toMatch(/^fieldbound map: cells  \[#+\] 100%  1000\/1000 cells/);
  });
});
