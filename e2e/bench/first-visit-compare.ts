// Compares first visits of the map page between client builds: one server per build directory (same database), and
// cold visits (a fresh browser context each, so nothing cached) alternating between the builds, so that the machine's
// load falls on all of them alike. For each build: long tasks (> 50 ms) from navigation to the full map — count,
// longest and blocking time (the sum of each task's time over 50 ms) — and the time to the full map.
// A developer's tool for changes that aim at the first visit (not part of `npm test` or `npm run bench`).
// Run: `cd e2e && FIELDBOUND_COMPARE_DIRS=/tmp/a,/tmp/b npx tsx bench/first-visit-compare.ts` with client builds in
// those directories (e.g. `cd frontend && npx vite build --outDir /tmp/a`); FIELDBOUND_COMPARE_VISITS (default 6).
import { chromium, type Browser } from '@playwright/test';
import { benchSetup, createBenchMap, startBenchServers } from './benchApp';
const FIRST_PORT = Number(process.env.FIELDBOUND_BENCH_PORT ?? 3180);
const DB = 'fieldbound_first_visit_compare_test';
const VISITS = Number(process.env.FIELDBOUND_COMPARE_VISITS ?? 6);

interface Visit {
  tasks: number;
  longestMs: number;
  blockingMs: number;
  fullMs: number;
  startMarkMs: number;
  /** Long tasks that begin at or after the computation's start mark (the work handed to the workers). */
  computingTasks: number;
}

/** A user with a team and the bench map on `base`; returns the map's address and the refresh cookie's state. */
async function prepare(browser: Browser, base: string) {
  const context = await browser.newContext();
  const mapId = await createBenchMap(context.request, base, await benchSetup(), 'First visit comparison');
  const storage = await context.storageState();
  await context.close();
  return { url: `${base}/maps/${mapId}`, storage };
}

async function visit(browser: Browser, target: Awaited<ReturnType<typeof prepare>>): Promise<Visit> {
  const context = await browser.newContext({ viewport: { width: 1440, height: 900 }, storageState: target.storage });
  const page = await context.newPage();
  await page.addInitScript({
    content: `window.__tasks = []; new PerformanceObserver((l) => { for (const e of l.getEntries()) window.__tasks.push({ start: e.startTime, duration: e.duration }); }).observe({ type: 'longtask', buffered: true });`,
  });
  await page.goto(target.url);
  await page.waitForFunction(() => performance.getEntriesByName('fieldbound:map:full-drawn').length >= 1, undefined, { timeout: 120_000, polling: 100 });
  const figures = await page.evaluate(() => {
    const full = performance.getEntriesByName('fieldbound:map:full-drawn')[0].startTime;
    const start = performance.getEntriesByName('fieldbound:map:start')[0].startTime;
    const tasks = (window as unknown as { __tasks: { start: number; duration: number }[] }).__tasks.filter((t) => t.start <= full);
    return {
      tasks: tasks.length,
      longestMs: Math.max(0, ...tasks.map((t) => t.duration)),
      blockingMs: tasks.reduce((s, t) => s + Math.max(0, t.duration - 50), 0),
      fullMs: full,
      startMarkMs: start,
      computingTasks: tasks.filter((t) => t.start >= start).length,
    };
  });
  // antd styles the page generated at run time (`<style>` elements; the static stylesheet is a `<link>`): the first
  // antd class of each, i.e. which components a build's extracted styles missed.
  const runtimeStyles = await page.evaluate(() => [...document.querySelectorAll('head style')].map((s) => (s.textContent ?? '').match(/\.ant-[a-z]+(?:-[a-z]+)?/)?.[0] ?? null).filter(Boolean));
  if (process.env.FIELDBOUND_COMPARE_STYLES === '2') console.log(await page.evaluate(() => [...document.querySelectorAll('head style')].map((s) => [...s.attributes].map((a) => `${a.name}=${a.value}`).join(' ') + ' :: ' + (s.textContent ?? '').slice(0, 140)).join('\n')));
  const runtimeBytes = await page.evaluate(() => [...document.querySelectorAll('head style')].reduce((n, s) => n + (s.textContent ?? '').length, 0));
  if (process.env.FIELDBOUND_COMPARE_STYLES === '1') console.log(`  styles generated at run time: ${runtimeStyles.length}, ${Math.round(runtimeBytes / 1024)} kB (${[...new Set(runtimeStyles)].join(' ')})`);
  // The refresh cookie rotates on every use (a reused one is refused): the next visit starts from this one's.
  target.storage = await context.storageState();
  await context.close();
  return figures;
}

async function main() {
  const dirs = (process.env.FIELDBOUND_COMPARE_DIRS ?? '').split(',').filter(Boolean);
  if (dirs.length < 1) throw new Error('Set FIELDBOUND_COMPARE_DIRS to one or more client build directories, comma-separated.');
  const { stop } = await startBenchServers(DB, dirs.map((dir, i) => ({ port: FIRST_PORT + i, staticDir: dir })));
  const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium' });
  try {
    const targets = await Promise.all(dirs.map((_, i) => prepare(browser, `http://127.0.0.1:${FIRST_PORT + i}`)));
    const results: Visit[][] = dirs.map(() => []);
    for (let v = 0; v < VISITS; v++) {
      for (let i = 0; i < dirs.length; i++) {
        const r = await visit(browser, targets[i]);
        results[i].push(r);
        console.log(`visit ${v + 1} ${dirs[i]}: ${r.tasks} long tasks (${r.computingTasks} while computing), longest ${Math.round(r.longestMs)} ms, blocking ${Math.round(r.blockingMs)} ms, start mark ${Math.round(r.startMarkMs)} ms, full map ${Math.round(r.fullMs)} ms`);
      }
    }
    const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
    console.log('\nmedians per build (from navigation to the full map):');
    dirs.forEach((dir, i) => {
      const rs = results[i];
      console.log(`  ${dir}: long tasks ${median(rs.map((r) => r.tasks))} (while computing: ${rs.map((r) => r.computingTasks).join(' ')}), longest ${Math.round(median(rs.map((r) => r.longestMs)))} ms, blocking ${Math.round(median(rs.map((r) => r.blockingMs)))} ms, start mark ${Math.round(median(rs.map((r) => r.startMarkMs)))} ms, full map ${Math.round(median(rs.map((r) => r.fullMs)))} ms`);
    });
  } finally {
    await browser.close();
    stop();
  }
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
