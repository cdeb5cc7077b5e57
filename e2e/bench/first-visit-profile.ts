// Where a first visit of the map page spends its main-thread time: records a Chrome CPU profile of the first visit of
// the explorer bench's map (navigation to the full map) and prints, for every long task (> 50 ms), the functions and
// source files with the most self time inside it. A developer's tool for the first-visit figures in
// docs/benchmarks.md (not part of `npm test` or `npm run bench`).
// Run (after `npm run build`): `cd e2e && npx tsx bench/first-visit-profile.ts`. For readable function names build an
// unminified client (`cd frontend && npx vite build --minify false --outDir /tmp/unmin`) and set
// FIELDBOUND_STATIC_DIR=/tmp/unmin. FIELDBOUND_PROFILE_OUT=<file.cpuprofile> keeps the raw profile.
import fs from 'node:fs';
import { chromium } from '@playwright/test';
import { benchSetup, createBenchMap, startBenchServers } from './benchApp';
const PORT = Number(process.env.FIELDBOUND_BENCH_PORT ?? 3172);
const DB = 'fieldbound_first_visit_profile_test';
const BASE = `http://127.0.0.1:${PORT}`;

interface ProfileNode {
  id: number;
  callFrame: { functionName: string; url: string; lineNumber: number };
  children?: number[];
}
interface Profile {
  nodes: ProfileNode[];
  startTime: number;
  samples: number[];
  timeDeltas: number[];
}

async function main() {
  const { stop } = await startBenchServers(DB, [{ port: PORT, staticDir: process.env.FIELDBOUND_STATIC_DIR }]);
  const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium' });
  try {
    const setup = await benchSetup();
    const context = await browser.newContext({ viewport: { width: 1440, height: 900 } });
    const page = await context.newPage();
    await page.addInitScript({
      content: `window.__tasks = []; new PerformanceObserver((l) => { for (const e of l.getEntries()) window.__tasks.push({ start: e.startTime, duration: e.duration }); }).observe({ type: 'longtask', buffered: true });`,
    });
    const mapId = await createBenchMap(page.request, BASE, setup, 'First visit profile');

    const cdp = await context.newCDPSession(page);
    await cdp.send('Profiler.enable');
    await cdp.send('Profiler.setSamplingInterval', { interval: 200 });
    await cdp.send('Profiler.start');
    const wallStart = Date.now();
    await page.goto(`${BASE}/maps/${mapId}`);
    await page.waitForFunction(() => performance.getEntriesByName('fieldbound:map:full-drawn').length >= 1, undefined, { timeout: 120_000 });
    // An anchor for the clocks: a 40 ms busy loop with a unique name, whose page start time is known.
    const anchorAt = (await page.evaluate('(function fieldboundProfileAnchor() { const t0 = performance.now(); while (performance.now() - t0 < 40); return t0; })()')) as number;
    const { profile } = (await cdp.send('Profiler.stop')) as { profile: Profile };
    const timeOrigin = await page.evaluate(() => performance.timeOrigin);
    const tasks = (await page.evaluate(() => (window as unknown as { __tasks: { start: number; duration: number }[] }).__tasks)) as { start: number; duration: number }[];
    const marks = await page.evaluate(() => performance.getEntriesByType('mark').map((m) => `${m.name}@${Math.round(m.startTime)}`));
    if (process.env.FIELDBOUND_PROFILE_OUT) fs.writeFileSync(process.env.FIELDBOUND_PROFILE_OUT, JSON.stringify(profile));
    console.log(`marks: ${marks.join(', ')} (profile started ${wallStart - Math.round(timeOrigin)} ms after time origin)`);

    // Profile timestamps are µs on the same monotonic clock as the page's timeOrigin (in ms since epoch for
    // timeOrigin, but Chrome's profile clock is monotonic): align by the first sample against navigation instead.
    const byId = new Map(profile.nodes.map((n) => [n.id, n]));
    const parent = new Map<number, number>();
    for (const n of profile.nodes) for (const c of n.children ?? []) parent.set(c, n.id);
    const times: number[] = [];
    let t = profile.startTime;
    for (const d of profile.timeDeltas) times.push((t += d));
    // Map profile µs to page ms: page performance.now() = (monotonic − navigationStart). Find offset with the marks is
    // not possible from the profile alone; use the CDP-reported page clock: Runtime.evaluate of performance.now() at stop.
    // Profile sample times are on Chrome's monotonic clock, the page's marks and long tasks on its own: the anchor's
    // first sample gives the offset (to within one sampling interval).
    const anchorIds = new Set(profile.nodes.filter((n) => n.callFrame.functionName === 'fieldboundProfileAnchor').map((n) => n.id));
    const lastIdx = profile.samples.length - 1;
    let firstAnchor = -1;
    for (let i = lastIdx; i >= 0; i--) {
      let inside = false;
      for (let j: number | undefined = profile.samples[i]; j !== undefined; j = parent.get(j)) if (anchorIds.has(j)) inside = true;
      if (inside) firstAnchor = i;
      else if (firstAnchor >= 0) break;
    }
    if (firstAnchor < 0) throw new Error('the clock anchor is not in the profile');
    const offsetMs = anchorAt - times[firstAnchor] / 1000;
    const label = (n: ProfileNode) => `${n.callFrame.functionName || '(anonymous)'} ${n.callFrame.url.split('/').pop()}:${n.callFrame.lineNumber + 1}`;
    const fileOf = (n: ProfileNode) => n.callFrame.url.split('/').pop() || `(${n.callFrame.functionName})`;
    const cssinjs = /^(useStyleRegister|useGlobalCache|useCacheToken|useCSSVarRegister|parseStyle|serialize|compile|genStyleHooks|genComponentStyleHook|injectCSS\$?1?|updateCSS\$?1?|getComputedToken|formatToken|genCSSVarRegister|useToken|mergeToken|statisticToken)$/;
    let cssTotal = 0;
    let taskTotal = 0;
    const onlyAfter = Number(process.env.FIELDBOUND_PROFILE_AFTER_MARK ? await page.evaluate((m) => performance.getEntriesByName(m)[0]?.startTime ?? 0, process.env.FIELDBOUND_PROFILE_AFTER_MARK) : 0);
    for (const task of tasks.filter((tk) => tk.start + tk.duration >= onlyAfter)) {
      const self = new Map<string, number>();
      const files = new Map<string, number>();
      const stacks = new Map<string, number>();
      for (let i = 0; i < profile.samples.length; i++) {
        const at = times[i] / 1000 + offsetMs;
        if (at < task.start || at > task.start + task.duration) continue;
        const dt = (profile.timeDeltas[i + 1] ?? 0) / 1000;
        const node = byId.get(profile.samples[i])!;
        self.set(label(node), (self.get(label(node)) ?? 0) + dt);
        // The nearest frame from our own sources or a library (by package path) gets the time too.
        let k: number | undefined = node.id;
        const seen = new Set<string>();
        taskTotal += dt;
        for (let j: number | undefined = node.id; j !== undefined; j = parent.get(j)) {
          if (cssinjs.test(byId.get(j)!.callFrame.functionName)) {
            cssTotal += dt;
            break;
          }
        }
        while (k !== undefined) {
          const f = fileOf(byId.get(k)!);
          if (!seen.has(f)) {
            seen.add(f);
            files.set(f, (files.get(f) ?? 0) + dt);
          }
          const fn = byId.get(k)!.callFrame.functionName;
          if (/^[A-Z][A-Za-z]+$/.test(fn)) stacks.set(fn, (stacks.get(fn) ?? 0) + dt);
          k = parent.get(k);
        }
      }
      const top = (m: Map<string, number>, n: number) => [...m].sort((a, b) => b[1] - a[1]).slice(0, n).map(([k2, v]) => `${v.toFixed(1)} ${k2}`).join('\n      ');
      console.log(`\nlong task at ${Math.round(task.start)} ms, ${Math.round(task.duration)} ms`);
      console.log(`  self:\n      ${top(self, 14)}`);
      console.log(`  inclusive by file:\n      ${top(files, 12)}`);
      console.log(`  inclusive by component (capitalised function names):\n      ${top(stacks, 16)}`);
    }
    console.log(`\nlong tasks: ${tasks.length}, ${taskTotal.toFixed(0)} ms sampled; under antd's CSS-in-JS (style register, token, stylis): ${cssTotal.toFixed(0)} ms`);
    await context.close();
  } finally {
    await browser.close();
    stop();
  }
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
