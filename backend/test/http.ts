import crypto from 'node:crypto';
import { MailService } from '../src/mail/mail.service';
import type { CapturedMessage } from '../src/mail/mail-fake';
import { startTestApp, type TestApp, type TestClock } from './test-app';

export interface Reply<T = any> {
  status: number;
  body: T;
  headers: Headers;
  /** The refresh cookie's value when the response set it ('' when it was cleared). */
  refreshCookie: string | undefined;
}

export interface CallOptions {
  token?: string;
  body?: unknown;
  cookie?: string;
  headers?: Record<string, string>;
}

/** One HTTP call to the test app with Node's fetch. */
export async function call<T = any>(server: TestApp, method: string, path: string, options: CallOptions = {}): Promise<Reply<T>> {
  const headers: Record<string, string> = { Accept: 'application/json', ...options.headers };
  if (options.body !== undefined) headers['Content-Type'] = 'application/json';
  if (options.token) headers.Authorization = `Bearer ${options.token}`;
  if (options.cookie !== undefined) headers.Cookie = `fieldbound_refresh=${options.cookie}`;
  const res = await fetch(`${server.baseUrl}${path}`, { method, headers, body: options.body === undefined ? undefined : JSON.stringify(options.body) });
  const text = await res.text();
  let body: unknown = null;
  try {
    body = text ? JSON.parse(text) : null;
  } catch {
    body = text;
  }
  const setCookie = res.headers.getSetCookie().find((c) => c.startsWith('fieldbound_refresh='));
  const refreshCookie = setCookie ? decodeURIComponent(setCookie.slice('fieldbound_refresh='.length).split(';')[0]) : undefined;
  return { status: res.status, body: body as T, headers: res.headers, refreshCookie };
}

export function uniqueEmail(label: string): string {
  return `${label}-${crypto.randomUUID().slice(0, 8)}@example.test`;
}

export const PASSWORD = 'correct horse battery';

export interface Account {
  id: string;
  email: string;
  password: string;
  displayName: string;
  token: string;
  cookie: string;
}

export async function registerAccount(server: TestApp, label: string, password = PASSWORD): Promise<Account> {
  const email = uniqueEmail(label);
  const displayName = `${label[0].toUpperCase()}${label.slice(1)} Tester`;
  const res = await call(server, 'POST', '/auth/register', { body: { email, password, displayName } });
  if (res.status !== 201) throw new Error(`register ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { id: res.body.user.id, email, password, displayName, token: res.body.accessToken, cookie: res.refreshCookie! };
}

/** A team owned by `owner`, plus accounts that joined it with each role (through real invitations). */
export async function createTeam(server: TestApp, owner: Account, name = `Team ${crypto.randomUUID().slice(0, 6)}`): Promise<string> {
  const res = await call(server, 'POST', '/teams', { token: owner.token, body: { name } });
  if (res.status !== 201) throw new Error(`create team failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.id;
}

/** Waits for the local mail fake to receive a message to `to`, and returns the newest one. */
export async function waitForMail(server: TestApp, to: string, subjectIncludes = '', timeoutMs = 5000): Promise<CapturedMessage> {
  const fake = server.app.get(MailService).fake;
  if (!fake) throw new Error('the mail fake is not running');
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = fake.list().find((m) => m.to.includes(to.toLowerCase()) && m.subject.includes(subjectIncludes));
    if (found) return found;
    if (Date.now() > deadline) throw new Error(`no mail to ${to} (subject containing "${subjectIncludes}") within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 25));
  }
}

/** The token part of the first link in a message whose path starts with `prefix` (e.g. '/invitations/'). */
export function tokenFromMail(message: CapturedMessage, prefix: string): string {
  const link = message.links.find((l) => new URL(l).pathname.startsWith(prefix));
  if (!link) throw new Error(`no ${prefix} link in "${message.subject}": ${message.links.join(', ')}`);
  return decodeURIComponent(new URL(link).pathname.slice(prefix.length));
}

/** Invites `email` with `role` and accepts through the e-mailed link with a new account. */
export async function joinWithRole(server: TestApp, owner: Account, teamId: string, label: string, role: 'owner' | 'editor' | 'viewer'): Promise<Account> {
  const email = uniqueEmail(label);
  const invited = await call(server, 'POST', `/teams/${teamId}/invitations`, { token: owner.token, body: { email, role } });
  if (invited.status !== 201) throw new Error(`invite failed: ${invited.status} ${JSON.stringify(invited.body)}`);
  const token = tokenFromMail(await waitForMail(server, email, 'Join'), '/invitations/');
  const displayName = `${label} Tester`;
  const res = await call(server, 'POST', `/invitations/${encodeURIComponent(token)}/register`, { body: { displayName, password: PASSWORD } });
  if (res.status !== 201) throw new Error(`accept failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { id: res.body.user.id, email, password: PASSWORD, displayName, token: res.body.accessToken, cookie: res.refreshCookie! };
}

/** An application on `clock` with one registered owner and their team: the start of the invitation specs. */
export async function startAppWithTeam(clock: TestClock, ownerLabel: string, teamName: string): Promise<{ server: TestApp; owner: Account; teamId: string }> {
  const server = await startTestApp({}, { clock });
  const owner = await registerAccount(server, ownerLabel);
  return { server, owner, teamId: await createTeam(server, owner, teamName) };
}
