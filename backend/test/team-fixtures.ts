import crypto from 'node:crypto';
import { EntityManager } from '@mikro-orm/postgresql';
import type { TeamRole } from '../src/teams/team-role';
import { Membership } from '../src/teams/membership.entity';
import { Team } from '../src/teams/team.entity';
import { User } from '../src/users/user.entity';
import type { TestApp } from './test-app';

/** A registered person with a live access token. */
export interface Person {
  id: string;
  email: string;
  displayName: string;
  token: string;
}

/** One team with a member of each role, plus an outsider who belongs to another team. */
export interface RoleCast {
  teamId: string;
  otherTeamId: string;
  owner: Person;
  editor: Person;
  viewer: Person;
  outsider: Person;
}

export const ROLES = ['owner', 'editor', 'viewer', 'outsider', 'anonymous'] as const;
export type Caller = (typeof ROLES)[number];

const unique = () => crypto.randomBytes(5).toString('hex');

/** Registers a person through the accounts API (unique e-mail per call). */
export async function registerPerson(t: TestApp, label: string): Promise<Person> {
  const email = `${label}-${unique()}@example.org`;
  const displayName = `${label[0].toUpperCase()}${label.slice(1)} ${unique().slice(0, 4)}`;
  const res = await fetch(`${t.baseUrl}/auth/register`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, displayName, password: 'correct horse battery staple' }),
  });
  if (res.status !== 201 && res.status !== 200) throw new Error(`register ${email}: ${res.status} ${await res.text()}`);
  const body = (await res.json()) as { accessToken: string; user: { id: string } };
  return { id: body.user.id, email, displayName, token: body.accessToken };
}

/** Creates a team through the API (the caller becomes its owner). */
export async function createTeam(t: TestApp, owner: Person, name = `Team ${unique()}`): Promise<string> {
  const res = await fetch(`${t.baseUrl}/teams`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', authorization: `Bearer ${owner.token}` },
    body: JSON.stringify({ name }),
  });
  if (res.status !== 201) throw new Error(`create team: ${res.status} ${await res.text()}`);
  return ((await res.json()) as { id: string }).id;
}

/** Adds a member with a role directly (the invitation round trip is the accounts tests' subject). */
export async function addMember(t: TestApp, teamId: string, person: Person, role: TeamRole): Promise<void> {
  const em = t.app.get(EntityManager).fork();
  em.persist(new Membership(em.getReference(Team, teamId), em.getReference(User, person.id), role));
  await em.flush();
}

export async function roleCast(t: TestApp): Promise<RoleCast> {
  const [owner, editor, viewer, outsider] = await Promise.all(['owner', 'editor', 'viewer', 'outsider'].map((l) => registerPerson(t, l)));
  const teamId = await createTeam(t, owner);
  const otherTeamId = await createTeam(t, outsider);
  await addMember(t, teamId, editor, 'editor');
  await addMember(t, teamId, viewer, 'viewer');
  return { teamId, otherTeamId, owner, editor, viewer, outsider };
}

/** A small fetch wrapper: JSON in, status and parsed body out. */
export function api(t: TestApp) {
  return async function call<T = any>(
    method: string,
    path: string,
    options: { as?: Person | null; token?: string; json?: unknown; form?: FormData; headers?: Record<string, string> } = {},
  ): Promise<{ status: number; body: T; headers: Headers }> {
    const headers: Record<string, string> = { ...options.headers };
    const token = options.token ?? options.as?.token;
    if (token) headers.authorization = `Bearer ${token}`;
    let body: RequestInit['body'];
    if (options.json !== undefined) {
      headers['content-type'] = 'application/json';
      body = JSON.stringify(options.json);
    } else if (options.form) {
      body = options.form;
    }
    const res = await fetch(`${t.baseUrl}${path}`, { method, headers, body });
    const type = res.headers.get('content-type') ?? '';
    const parsed = type.includes('json') ? await res.json() : type.startsWith('image/') ? Buffer.from(await res.arrayBuffer()) : await res.text();
    return { status: res.status, body: parsed as T, headers: res.headers };
  };
}

export function callerOf(cast: RoleCast, caller: Caller): Person | null {
  return caller === 'anonymous' ? null : cast[caller];
}

/** A tiny valid PNG (1×1, grey). */
export const PNG_1x1 = Buffer.from('89504e470d0a1a0a0000000d4948445200000001000000010800000000' + '3a7e9b550000000a49444154789c636000000002000154a24f5d0000000049454e44ae426082', 'hex');

/** A multipart body carrying a thumbnail upload. */
export function thumbnailForm(bytes: Buffer = PNG_1x1): FormData {
  const form = new FormData();
  form.append('file', new Blob([new Uint8Array(bytes)], { type: 'image/png' }), 'thumb.png');
  return form;
}
