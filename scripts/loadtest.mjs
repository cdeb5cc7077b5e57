// `npm run loadtest`: the built server under a realistic mix of reads and writes from many clients.
// Starts (or reuses) the local PostgreSQL cluster, creates a fresh database `fieldbound_loadtest` with the
// demo seed, runs the built backend on 127.0.0.1:FIELDBOUND_LOADTEST_PORT (3195), signs in the demo people,
// and replays a mix from many clients: list maps, open a map and its pins, read the lecture's viewing link, add pins,
// reply, save setups with expectedVersion (clients with think time, or autocannon's closed loop for the capacity). Bounded in time (--duration) and requests (--max-requests).
// Prints a table per kind of request and writes the figures to docs/loadtest.md (--no-write to skip).
//
// Options: --connections N (200) --duration S (60) --think-ms T (2000: each client pauses T ms on average before each
//          request; 0 = closed loop with autocannon, no pause: the capacity) --max-requests N (600000) --warmup S (5)
//          --streams-per-person N (15: live streams held open per demo person during a run with think time)
//          --no-build --no-write
//          --keep-db (leave the database for inspection)
//          --profile (instead of the mix, each kind of request alone from 4 connections, with the CPU the server
//          process and the PostgreSQL processes spend per request, from /proc: where the time goes).
// The cluster stays up afterwards (`npm run db:down` stops it).
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { spawn } from 'node:child_process';
import http from 'node:http';
import { performance } from 'node:perf_hooks';
import { repoRoot } from './lib/paths.mjs';
import { step, failAndExit, BootstrapError } from './lib/log.mjs';
import { runOrThrow } from './lib/run.mjs';
import { ensureNodeModules } from './lib/deps.mjs';
import { LocalCluster, assertPortFree } from './lib/postgres.mjs';

const DATABASE = process.env.FIELDBOUND_LOADTEST_DB ?? 'fieldbound_loadtest';
const PORT = Number(process.env.FIELDBOUND_LOADTEST_PORT ?? 3195);
const BASE = `http://127.0.0.1:${PORT}`;
const LECTURE_TOKEN = 'demo-lecture-link-Solberg-group-anions-2026';
// The demo people (README.md). The viewer only reads and replies; the others also write.
const PEOPLE = [
  { key: 'owner', email: 'maren.solberg@demo.fieldbound.test', password: 'demo-owner-2026', writes: true },
  { key: 'editorA', email: 'kofi.mensah@demo.fieldbound.test', password: 'demo-editor-2026', writes: true },
  { key: 'editorB', email: 'ilse.varga@demo.fieldbound.test', password: 'demo-editor-2026', writes: true },
  { key: 'viewer', email: 'tariq.bello@demo.fieldbound.test', password: 'demo-viewer-2026', writes: false },
];
/** Maps the writers save to (the six demo maps plus duplicates), so saves spread like a group's work does. */
const SAVE_MAPS = 30;
const TARGET_P99 = { read: 100, write: 250 };
const WRITE_KINDS = new Set(['add pin', 'reply', 'save setup']);

function parseArgs(argv) {
  const opts = { connections: 200, duration: 60, maxRequests: 600_000, warmup: 5, build: true, write: true, keepDb: false, profile: false, thinkMs: 2000, streamsPerPerson: 15 };
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i];
    const number = () => {
      const value = Number(argv[++i]);
      if (!Number.isFinite(value) || value < 0) throw new BootstrapError(`${arg} needs a non-negative number, got "${argv[i]}"`);
      return value;
    };
    if (arg === '--connections') opts.connections = number();
    else if (arg === '--duration') opts.duration = number();
    else if (arg === '--max-requests') opts.maxRequests = number();
    else if (arg === '--warmup') opts.warmup = number();
    else if (arg === '--no-build') opts.build = false;
    else if (arg === '--no-write') opts.write = false;
    else if (arg === '--keep-db') opts.keepDb = true;
    else if (arg === '--profile') opts.profile = true;
    else if (arg === '--think-ms') opts.thinkMs = number();
    else if (arg === '--streams-per-person') opts.streamsPerPerson = number();
    else throw new BootstrapError(`unknown option ${arg}; see the head of scripts/loadtest.mjs`);
  }
  if (opts.connections < 1 || opts.duration < 1) throw new BootstrapError('--connections and --duration must be at least 1');
  return opts;
}

async function api(method, url, { token, body, ip } = {}) {
  const response = await fetch(`${BASE}${url}`, {
    method,
    headers: {
      ...(body ? { 'content-type': 'application/json' } : {}),
      ...(token ? { authorization: `Bearer ${token}` } : {}),
      ...(ip ? { 'x-forwarded-for': ip } : {}),
    },
    body: body ? JSON.stringify(body) : undefined,
  });
  const text = await response.text();
  if (!response.ok) throw new BootstrapError(`${method} ${url} answered ${response.status}: ${text.slice(0, 300)}`);
  return text ? JSON.parse(text) : null;
}

async function waitForServer(server) {
  const deadline = Date.now() + 60_000;
  while (Date.now() < deadline) {
    if (server.exitCode !== null) throw new BootstrapError(`the server exited with ${server.exitCode}; see .data/loadtest-server.log`);
    try {
      const response = await fetch(`${BASE}/api/health`);
      if (response.ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((resolve) => setTimeout(resolve, 250));
  }
  throw new BootstrapError('the server did not answer /api/health within 60 s');
}

/** Signs in the demo people and prepares the maps the clients work on. */
async function prepare() {
  const sessions = [];
  for (const person of PEOPLE) {
    const signedIn = await api('POST', '/api/auth/sign-in', { body: { email: person.email, password: person.password } });
    sessions.push({ ...person, token: signedIn.accessToken });
  }
  const owner = sessions[0];
  const teams = await api('GET', '/api/teams', { token: owner.token });
  const team = teams.find((t) => t.name.includes('(demo)')) ?? teams[0];
  const list = await api('GET', `/api/teams/${team.id}/maps?limit=100`, { token: owner.token });
  const demoMaps = (list.items ?? list).map((m) => m.id);
  const saveMaps = [...demoMaps];
  for (let i = 0; saveMaps.length < SAVE_MAPS; i++) {
    const copy = await api('POST', `/api/maps/${demoMaps[i % demoMaps.length]}/duplicate`, { token: owner.token, body: { teamId: team.id } });
    saveMaps.push(copy.id);
  }
  // A pin on every map, so each client has a thread to reply to from its first cycle on.
  for (const mapId of saveMaps) {
    await api('POST', `/api/maps/${mapId}/pins`, {
      token: owner.token,
      body: { geometry: { kind: 'point', at: { alpha: 100, fieldTesla: 10 } }, title: 'Load test thread', body: 'Replies from the load test go here.' },
    });
  }
  return { sessions, teamId: team.id, allMaps: saveMaps, saveMaps };
}

/** The request cycle each connection repeats; a viewer's writes become the reads a viewer would do instead. */
function requestCycle({ sessions, teamId, allMaps, saveMaps }, samples) {
  let cycles = 0;
  const json = (body) => JSON.stringify(body);
  const headersFor = (context, extra = {}) => ({
    authorization: `Bearer ${context.person.token}`,
    // Every simulated person comes from their own address (the server trusts X-Forwarded-For from loopback
    // proxies, as behind a reverse proxy), so the per-address rate limits apply per person as in real use.
    'x-forwarded-for': context.ip,
    ...extra,
  });
  const timed = (kind, build) => ({
    setupRequest: (req, context) => {
      const next = build(req, context);
      if (next) {
        context.kind = next.kind ?? kind;
        context.sentAt = performance.now();
      }
      return next;
    },
    onResponse: (status, body, context) => {
      samples.record(context.kind, status, performance.now() - context.sentAt);
      context.last = { status, body };
    },
  });
  const parse = (context) => {
    try {
      return JSON.parse(context.last.body);
    } catch {
      return null;
    }
  };
  return [
    timed('list maps', (req, context) => {
      // A new cycle: this connection acts for one person from one address until the cycle ends.
      const n = cycles++;
      context.n = n;
      context.person = sessions[n % sessions.length];
      context.ip = `198.18.${Math.floor((n % 4000) / 250)}.${n % 250}`;
      context.mapA = saveMaps[n % saveMaps.length];
      context.mapB = allMaps[Math.floor(Math.random() * allMaps.length)];
      return { ...req, method: 'GET', path: `/api/teams/${teamId}/maps`, headers: headersFor(context) };
    }),
    timed('open map', (req, context) => ({ ...req, method: 'GET', path: `/api/maps/${context.mapA}`, headers: headersFor(context) })),
    timed('map pins', (req, context) => {
      const map = parse(context);
      if (map) context.version = map.version;
      if (map) context.setup = map.setup;
      return { ...req, method: 'GET', path: `/api/maps/${context.mapA}/pins`, headers: headersFor(context) };
    }),
    timed('viewing link', (req, context) => {
      const pins = parse(context);
      const items = Array.isArray(pins) ? pins : (pins?.items ?? []);
      if (items.length) context.pinId = items[Math.floor(Math.random() * items.length)].id;
      return { ...req, method: 'GET', path: `/api/view/${LECTURE_TOKEN}`, headers: { 'x-forwarded-for': context.ip } };
    }),
    timed('open map', (req, context) => ({ ...req, method: 'GET', path: `/api/maps/${context.mapB}`, headers: headersFor(context) })),
    timed('map pins', (req, context) => ({ ...req, method: 'GET', path: `/api/maps/${context.mapB}/pins`, headers: headersFor(context) })),
    timed('add pin', (req, context) => {
      // One cycle in four adds a pin (a viewer reads the versions instead); the others open a pin's thread.
      if (!context.person.writes) return { ...req, kind: 'map versions', method: 'GET', path: `/api/maps/${context.mapA}/versions`, headers: headersFor(context) };
      if (context.n % 4 !== 0 && context.pinId) return { ...req, kind: 'open pin', method: 'GET', path: `/api/pins/${context.pinId}`, headers: headersFor(context) };
      const alpha = 20 + (context.n % 400);
      return {
        ...req,
        method: 'POST',
        path: `/api/maps/${context.mapA}/pins`,
        headers: headersFor(context, { 'content-type': 'application/json' }),
        body: json({ geometry: { kind: 'point', at: { alpha, fieldTesla: 1 + (context.n % 40) } }, title: `Check α = ${alpha}`, body: `Load test note ${context.n}: is this state bound at 4 K?` }),
      };
    }),
    timed('reply', (req, context) => {
      if (!context.pinId) return { ...req, kind: 'open map', method: 'GET', path: `/api/maps/${context.mapA}`, headers: headersFor(context) };
      return {
        ...req,
        method: 'POST',
        path: `/api/pins/${context.pinId}/replies`,
        headers: headersFor(context, { 'content-type': 'application/json' }),
        body: json({ body: `Reply ${context.n}: agreed, worth a second look.` }),
      };
    }),
    timed('save setup', (req, context) => {
      if (!context.person.writes || !context.setup || !context.version) {
        return { ...req, kind: 'list maps', method: 'GET', path: `/api/teams/${teamId}/maps`, headers: headersFor(context) };
      }
      const floors = [1e-3, 2e-3, 5e-4, 1.5e-3];
      const setup = { ...context.setup, energyFloorKelvin: floors[context.n % floors.length] };
      return {
        ...req,
        method: 'PATCH',
        path: `/api/maps/${context.mapA}`,
        headers: headersFor(context, { 'content-type': 'application/json' }),
        body: json({ expectedVersion: context.version, setup, description: `Saved by the load test, cycle ${context.n}.` }),
      };
    }),
  ];
}

class Samples {
  constructor() {
    this.byKind = new Map();
    this.enabled = true;
  }
  record(kind, status, ms) {
    if (!this.enabled) return;
    let entry = this.byKind.get(kind);
    if (!entry) this.byKind.set(kind, (entry = { ms: [], ok: 0, conflicts: 0, throttled: 0, errors: 0, statuses: {} }));
    entry.ms.push(ms);
    entry.statuses[status] = (entry.statuses[status] ?? 0) + 1;
    if (status >= 200 && status < 300) entry.ok++;
    else if (status === 409 && kind === 'save setup') entry.conflicts++; // the optimistic-locking protocol, not a failure
    else if (status === 429) entry.throttled++;
    else entry.errors++;
  }
}

function percentile(sorted, p) {
  if (!sorted.length) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

function summarise(entries) {
  const ms = entries.flatMap((e) => e.ms).sort((a, b) => a - b);
  const sum = (key) => entries.reduce((total, e) => total + e[key], 0);
  return {
    requests: ms.length, ok: sum('ok'), conflicts: sum('conflicts'), throttled: sum('throttled'), errors: sum('errors'),
    p50: percentile(ms, 50), p90: percentile(ms, 90), p99: percentile(ms, 99), max: ms[ms.length - 1] ?? NaN,
  };
}

function table(rows) {
  const header = ['kind', 'requests', '2xx', '409 (save conflicts)', '429', 'errors', 'p50 ms', 'p90 ms', 'p99 ms', 'max ms'];
  const fmt = (v) => (typeof v === 'number' ? (Number.isInteger(v) ? String(v) : v.toFixed(1)) : v);
  const lines = rows.map((r) => [r.kind, r.requests, r.ok, r.conflicts, r.throttled, r.errors, r.p50, r.p90, r.p99, r.max].map(fmt));
  return [`| ${header.join(' | ')} |`, `|${header.map(() => '---').join('|')}|`, ...lines.map((l) => `| ${l.join(' | ')} |`)].join('\n');
}

function loadAverage() {
  return os.loadavg().map((v) => v.toFixed(2)).join(', ');
}

async function main() {
  const opts = parseArgs(process.argv.slice(2));
  ensureNodeModules();
  const { default: autocannon } = await import('autocannon');
  const cluster = new LocalCluster();
  // A cluster this run starts is left running (other work on the machine may use it by then); `npm run db:down` stops it.
  await cluster.start();
  step(`fresh database ${DATABASE} with the demo seed`);
  cluster.ensureDatabase(DATABASE, { fresh: true });
  if (opts.build) {
    // Only what the server needs: the engine package and the backend (the frontend is not served here).
    step('building shared and backend');
    runOrThrow('npm', ['run', 'build', '-w', 'shared'], { cwd: repoRoot });
    runOrThrow('npm', ['run', 'build', '-w', 'backend'], { cwd: repoRoot });
  }
  const env = { ...process.env, ...cluster.envFor(DATABASE) };
  const dbCli = path.join(repoRoot, 'backend', 'dist', 'database', 'db-cli.js');
  runOrThrow(process.execPath, [dbCli, 'migrate'], { env });
  runOrThrow(process.execPath, [dbCli, 'seed'], { env });

  await assertPortFree(PORT, 'FIELDBOUND_LOADTEST_PORT', 'the load-test server port');
  const logFile = path.join(repoRoot, '.data', 'loadtest-server.log');
  const log = fs.openSync(logFile, 'w');
  step(`starting the built server on ${BASE} (its log: .data/loadtest-server.log)`);
  const server = spawn(process.execPath, [path.join(repoRoot, 'backend', 'dist', 'main.js')], {
    env: { ...env, FIELDBOUND_HOST: '127.0.0.1', FIELDBOUND_PORT: String(PORT), FIELDBOUND_PUBLIC_URL: BASE },
    stdio: ['ignore', log, log],
  });
  const stopServer = async () => {
    if (server.exitCode !== null) return;
    server.kill('SIGTERM');
    await new Promise((resolve) => server.once('exit', resolve));
  };
  let cpuBefore;
  try {
    await waitForServer(server);
    const world = await prepare();
    if (opts.profile) {
      await profileKinds(world, autocannon, server.pid, cluster);
      return;
    }
    const samples = new Samples();
    const requests = requestCycle(world, samples);

    if (opts.warmup > 0) {
      step(`warm-up: ${opts.warmup} s with ${Math.min(50, opts.connections)} connections (not counted)`);
      samples.enabled = false;
      await autocannon({ url: BASE, connections: Math.min(50, opts.connections), duration: opts.warmup, requests, timeout: 10 });
      samples.enabled = true;
    }
    const loadBefore = loadAverage();
    cpuBefore = readProcCpu(server.pid);
    const paced = opts.thinkMs > 0;
    step(
      `load: ${opts.connections} ${paced ? `clients, each pausing ${opts.thinkMs} ms on average before each request,` : 'connections with no pause (closed loop),'} for ${opts.duration} s (at most ${opts.maxRequests} requests); load average before ${loadBefore}`,
    );
    const started = Date.now();
    const result = paced
      ? await withLiveStreams(world, opts.streamsPerPerson, () =>
          pacedRun({ requests, clients: opts.connections, seconds: opts.duration, thinkMs: opts.thinkMs, maxRequests: opts.maxRequests, timeoutMs: 10_000 }),
        )
      : await autocannon({ url: BASE, connections: opts.connections, duration: opts.duration, maxOverallRequests: opts.maxRequests, requests, timeout: 10 });
    const seconds = result.seconds ?? (Date.now() - started) / 1000;
    const serverCpu = (readProcCpu(server.pid) - cpuBefore) / seconds;
    const loadAfter = loadAverage();

    const kinds = [...samples.byKind.keys()].sort((a, b) => Number(WRITE_KINDS.has(a)) - Number(WRITE_KINDS.has(b)) || a.localeCompare(b));
    const rows = kinds.map((kind) => ({ kind, ...summarise([samples.byKind.get(kind)]) }));
    const reads = summarise(kinds.filter((k) => !WRITE_KINDS.has(k)).map((k) => samples.byKind.get(k)));
    const writes = summarise(kinds.filter((k) => WRITE_KINDS.has(k)).map((k) => samples.byKind.get(k)));
    rows.push({ kind: '**all reads**', ...reads }, { kind: '**all writes**', ...writes });
    // autocannon counts a timeout both in `errors` and in `timeouts`.
    const connectionErrors = result.errors;
    const statuses = Object.fromEntries([...samples.byKind.entries()].map(([k, e]) => [k, e.statuses]));
    const verdict = [
      `errors: ${reads.errors + writes.errors + connectionErrors} (HTTP ${reads.errors + writes.errors}; connection errors and timeouts ${connectionErrors}, of which timeouts after 10 s ${result.timeouts}) — target 0`,
      `throttled (429): ${reads.throttled + writes.throttled} — target 0`,
      `p99 reads ${reads.p99.toFixed(1)} ms — target < ${TARGET_P99.read} ms`,
      `p99 writes ${writes.p99.toFixed(1)} ms — target < ${TARGET_P99.write} ms`,
    ];
    if (result.streams) {
      const st = result.streams;
      verdict.push(`live streams: ${st.opened} of ${st.wanted} open through the run (map pages receiving pin and save events), ${st.events} events delivered, ${st.failed} refused or dropped — target 0 dropped`);
    }
    const streamsFailed = result.streams?.failed ?? 0;
    const pass = streamsFailed === 0 && reads.errors + writes.errors + connectionErrors === 0 && reads.throttled + writes.throttled === 0 && reads.p99 < TARGET_P99.read && writes.p99 < TARGET_P99.write;
    const clientsText = paced ? `${opts.connections} clients pausing ${opts.thinkMs} ms on average (exponential) before each request` : `${opts.connections} connections, closed loop (no pause)`;
    const summaryLine = `${reads.requests + writes.requests} requests in ${seconds.toFixed(1)} s (${((reads.requests + writes.requests) / seconds).toFixed(0)} per second), ${clientsText}; server process CPU ${(serverCpu * 100).toFixed(0)} % of one core; load average before ${loadBefore}, after ${loadAfter}`;
    console.log(`\n${table(rows)}\n\n${summaryLine}\n${verdict.join('\n')}\n${pass ? 'PASS' : 'FAIL'}: targets ${pass ? 'met' : 'not met'}`);
    if (reads.errors + writes.errors) console.log(`status codes per kind: ${JSON.stringify(statuses)}`);

    if (opts.write) {
      writeDoc({ opts, rows, summaryLine, verdict, pass, statuses, mode: paced ? 'paced' : 'closed' });
      step('figures written to docs/loadtest.md');
    }
    process.exitCode = pass ? 0 : 1;
  } finally {
    await stopServer();
    fs.closeSync(log);
    if (!opts.keepDb) cluster.sql(`DROP DATABASE IF EXISTS ${DATABASE} WITH (FORCE)`);
  }
}

/**
 * Each kind of request alone: 4 connections, a fixed number of requests, and the CPU the server process and the
 * cluster's PostgreSQL processes spent on them (user + system, from /proc), per request. Serial enough that
 * queueing does not count; the figures are CPU, not latency.
 */
async function profileKinds({ sessions, teamId, saveMaps }, autocannon, serverPid, cluster) {
  const editor = sessions[1];
  const auth = { authorization: `Bearer ${editor.token}`, 'x-forwarded-for': '198.18.200.1' };
  const pins = await api('GET', `/api/maps/${saveMaps[0]}/pins`, { token: editor.token });
  const pinId = (Array.isArray(pins) ? pins : pins.items)[0].id;
  const postJson = (path, body) => ({ method: 'POST', path, headers: { ...auth, 'content-type': 'application/json' }, body: JSON.stringify(body) });
  // Saves go round robin over 20 maps with the version the last answer for that map gave, so with 4 requests in
  // flight nearly every save lands (autocannon starts a fresh context for every request of a one-request list).
  const saveVersions = new Map();
  for (const mapId of saveMaps.slice(10, 30)) saveVersions.set(mapId, (await api('GET', `/api/maps/${mapId}`, { token: editor.token })).version);
  let saveSlots = 0;
  const saveSetup = {
    setupRequest: (req, context) => {
      context.map = saveMaps[10 + (saveSlots++ % 20)];
      context.version = saveVersions.get(context.map);
      return {
        ...req, method: 'PATCH', path: `/api/maps/${context.map}`, headers: { ...auth, 'content-type': 'application/json' },
        body: JSON.stringify({ expectedVersion: context.version, description: `Profile save ${context.version}` }),
      };
    },
    onResponse: (status, body, context) => {
      // A 409 (a save of the warm-up still in flight when it stopped) carries the current map: carry on from it.
      const answer = JSON.parse(body);
      const version = status === 200 ? answer.version : answer.current?.version;
      if (version) saveVersions.set(context.map, (context.version = version));
    },
  };
  const kinds = [
    ['health (no sign-in)', [{ method: 'GET', path: '/api/health' }]],
    ['list maps', [{ method: 'GET', path: `/api/teams/${teamId}/maps`, headers: auth }]],
    ['open map', [{ method: 'GET', path: `/api/maps/${saveMaps[0]}`, headers: auth }]],
    ['map pins', [{ method: 'GET', path: `/api/maps/${saveMaps[0]}/pins`, headers: auth }]],
    ['open pin', [{ method: 'GET', path: `/api/pins/${pinId}`, headers: auth }]],
    ['map versions', [{ method: 'GET', path: `/api/maps/${saveMaps[0]}/versions`, headers: auth }]],
    ['viewing link', [{ method: 'GET', path: `/api/view/${LECTURE_TOKEN}`, headers: { 'x-forwarded-for': '198.18.200.2' } }]],
    ['add pin', [postJson(`/api/maps/${saveMaps[1]}/pins`, { geometry: { kind: 'point', at: { alpha: 50, fieldTesla: 5 } }, title: 'Profile pin', body: 'Profile.' })]],
    ['reply', [postJson(`/api/pins/${pinId}/replies`, { body: 'Profile reply.' })]],
    ['save setup', [saveSetup]],
  ];
  const amount = 400;
  const rows = [];
  for (const [kind, requests] of kinds) {
    // The viewing link allows 120 views a minute per address: stay inside it with one connection's worth.
    const n = kind === 'viewing link' ? 100 : amount;
    await autocannon({ url: BASE, connections: kind === 'viewing link' ? 1 : 4, amount: kind === 'viewing link' ? 10 : 40, requests, timeout: 10 }); // warm this path
    const serverBefore = readProcCpu(serverPid);
    const pgBefore = postgresCpu(cluster);
    const started = performance.now();
    const result = await autocannon({ url: BASE, connections: kind === 'viewing link' ? 1 : 4, amount: n, requests, timeout: 10 });
    const seconds = (performance.now() - started) / 1000;
    const serverMs = ((readProcCpu(serverPid) - serverBefore) * 1000) / n;
    const pgMs = ((postgresCpu(cluster) - pgBefore) * 1000) / n;
    const bad = result.non2xx + result.errors;
    if (bad) step(`${kind}: status codes ${JSON.stringify(result.statusCodeStats)}`);
    rows.push([kind, n, bad, serverMs.toFixed(2), pgMs.toFixed(2), (n / seconds).toFixed(0), result.latency.p50, result.latency.p99]);
    step(`${kind}: server ${serverMs.toFixed(2)} ms CPU, PostgreSQL ${pgMs.toFixed(2)} ms CPU per request${bad ? ` (${bad} not 2xx!)` : ''}`);
  }
  const header = ['kind', 'requests', 'not 2xx', 'server CPU ms/request', 'PostgreSQL CPU ms/request', 'requests/s', 'p50 ms', 'p99 ms'];
  console.log(`\n| ${header.join(' | ')} |\n|${header.map(() => '---').join('|')}|\n${rows.map((r) => `| ${r.join(' | ')} |`).join('\n')}`);
  console.log(`\nload average ${loadAverage()} (other work on the machine inflates CPU per request)`);
}

/** CPU seconds of every process of the local cluster (postmaster and its children) so far. */
function postgresCpu(cluster) {
  let postmaster;
  try {
    postmaster = Number(fs.readFileSync(path.join(cluster.pgdata, 'postmaster.pid'), 'utf8').split('\n')[0]);
  } catch {
    return NaN;
  }
  let total = readProcCpu(postmaster);
  for (const entry of fs.readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const fields = fs.readFileSync(`/proc/${entry}/stat`, 'utf8').split(') ')[1].split(' ');
      if (Number(fields[1]) === postmaster) total += (Number(fields[11]) + Number(fields[12])) / 100;
    } catch {
      // the process ended meanwhile
    }
  }
  return total;
}

/**
 * Clients with think time: each of `clients` simulated people repeats the request cycle, pausing a random time
 * (exponential, mean `thinkMs`, so the clients do not fall into step) before each request, over its own
 * keep-alive connection. Uses the same request builders as the autocannon run (setupRequest/onResponse with a
 * context per cycle), so both modes replay the same mix. Returns autocannon's error and timeout counts' shape.
 */
async function pacedRun({ requests, clients, seconds, thinkMs, maxRequests, timeoutMs }) {
  const until = performance.now() + seconds * 1000;
  const agent = new http.Agent({ keepAlive: true, maxSockets: clients });
  const counts = { errors: 0, timeouts: 0, sent: 0 };
  const began = performance.now();
  // Never past the end of the run: the run's length is its length.
  const pause = () => new Promise((resolve) => setTimeout(resolve, Math.min(-Math.log(1 - Math.random()) * thinkMs, Math.max(0, until - performance.now()))));
  const send = (req) =>
    new Promise((resolve) => {
      const body = req.body === undefined ? undefined : Buffer.from(req.body);
      const request = http.request(
        { host: '127.0.0.1', port: PORT, method: req.method, path: req.path, agent, headers: { ...req.headers, ...(body ? { 'content-length': body.length } : {}) }, timeout: timeoutMs },
        (response) => {
          const chunks = [];
          response.on('data', (chunk) => chunks.push(chunk));
          response.on('end', () => resolve({ status: response.statusCode, body: Buffer.concat(chunks).toString('utf8') }));
          response.on('error', () => resolve(null));
        },
      );
      request.on('timeout', () => {
        counts.timeouts++;
        request.destroy(new Error('timeout'));
      });
      request.on('error', () => resolve(null));
      request.end(body);
    });
  const client = async () => {
    // Start spread over one think time, as people arriving, not all at once.
    await pause();
    while (performance.now() < until && counts.sent < maxRequests) {
      const context = {};
      for (const step of requests) {
        if (performance.now() >= until || counts.sent >= maxRequests) return;
        const req = step.setupRequest({}, context);
        counts.sent++;
        const answer = await send(req);
        if (!answer) {
          counts.errors++;
          // No answer to record: the cycle cannot go on from here; start a new one after a pause.
          break;
        }
        step.onResponse(answer.status, answer.body, context);
        await pause();
      }
    }
  };
  await Promise.all(Array.from({ length: clients }, client));
  agent.destroy();
  return { ...counts, seconds: (performance.now() - began) / 1000 };
}

/**
 * Open map pages hold a live stream (server-sent events) while people work: `perPerson` streams for each demo
 * person (the server allows 20 per account), spread over the maps the clients save to, open for the whole run.
 * Counts the events they receive; a stream refused or ended early counts as failed.
 */
async function withLiveStreams({ sessions, saveMaps }, perPerson, run) {
  const streams = { wanted: perPerson * sessions.length, opened: 0, events: 0, failed: 0 };
  const requests = [];
  let ending = false;
  for (let i = 0; i < streams.wanted; i++) {
    const person = sessions[i % sessions.length];
    const mapId = saveMaps[i % saveMaps.length];
    await new Promise((resolve) => {
      const request = http.get(
        { host: '127.0.0.1', port: PORT, path: `/api/maps/${mapId}/events`, headers: { authorization: `Bearer ${person.token}`, accept: 'text/event-stream' } },
        (response) => {
          if (response.statusCode !== 200) {
            streams.failed++;
            response.resume();
            return resolve();
          }
          streams.opened++;
          response.setEncoding('utf8');
          response.on('data', (text) => (streams.events += (text.match(/^event: map$/gm) ?? []).length));
          response.on('end', () => ending || streams.failed++);
          resolve();
        },
      );
      request.on('error', () => {
        if (!ending) streams.failed++;
        resolve();
      });
      requests.push(request);
    });
  }
  try {
    return { ...(await run()), streams };
  } finally {
    ending = true;
    for (const request of requests) request.destroy();
  }
}

/** User + system CPU seconds of a process so far (Linux /proc). */
function readProcCpu(pid) {
  try {
    const fields = fs.readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
    return (Number(fields[11]) + Number(fields[12])) / 100; // utime, stime in clock ticks (100 per second on Linux)
  } catch {
    return NaN;
  }
}

/** Replaces the section of this mode (paced: the targets; closed: the capacity) in docs/loadtest.md. */
function writeDoc({ opts, rows, summaryLine, verdict, pass, statuses, mode }) {
  const file = path.join(repoRoot, 'docs', 'loadtest.md');
  const cpu = os.cpus();
  const start = `<!-- loadtest:${mode}:start -->`;
  const end = `<!-- loadtest:${mode}:end -->`;
  const title = mode === 'paced' ? 'Last run with think time (the targets)' : 'Last closed-loop run (capacity, no think time)';
  const command = `npm run loadtest -- --connections ${opts.connections} --duration ${opts.duration} --think-ms ${opts.thinkMs}`;
  const section = [
    start,
    `### ${title}: ${new Date().toISOString().replace(/\.\d+Z$/, ' UTC').replace('T', ' ')}`,
    '',
    `Machine: ${cpu.length} × ${cpu[0]?.model.trim() ?? 'unknown CPU'}, ${(os.totalmem() / 2 ** 30).toFixed(0)} GiB, Node ${process.version}; the load generator, the server and PostgreSQL share these cores (other work may have run too: see the load average).`,
    `Run: \`${command}\`.`,
    '',
    table(rows),
    '',
    summaryLine + '.',
    '',
    ...verdict.map((v) => `- ${v}`),
    '',
    `**${pass ? 'Targets met.' : 'Targets not met in this run.'}**`,
    '',
    '<details><summary>Status codes per kind</summary>',
    '',
    '```json',
    JSON.stringify(statuses, null, 1),
    '```',
    '</details>',
    end,
  ].join('\n');
  const existing = fs.existsSync(file) ? fs.readFileSync(file, 'utf8') : '# Load test\n\n(see scripts/loadtest.mjs)\n';
  const updated = existing.includes(start) && existing.includes(end)
    ? existing.slice(0, existing.indexOf(start)) + section + existing.slice(existing.indexOf(end) + end.length)
    : `${existing.trimEnd()}\n\n${section}\n`;
  fs.writeFileSync(file, updated);
}

main().catch(failAndExit);
