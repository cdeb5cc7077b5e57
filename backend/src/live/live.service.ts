import { Injectable } from '@nestjs/common';
import { EntityManager } from '@mikro-orm/postgresql';
import type { Request, Response } from 'express';
import { Clock } from '../common/clock';
import type { AuthUser } from '../common/current-user.decorator';
import { fieldError } from '../common/validation';
import { MapAccessService } from '../maps/map-access.service';
import { ViewingLinksService } from '../viewing-links/viewing-links.service';
import { LiveHubService } from './live-hub.service';

/** `Last-Event-ID` header (what browsers send on reconnecting) or `?lastEventId=`: a positive decimal id. */
export function parseLastEventId(header: string | undefined, query: string | undefined): bigint | null {
  const raw = (header ?? query ?? '').trim();
  if (raw === '') return null;
  if (!/^\d{1,19}$/.test(raw)) throw fieldError('lastEventId', 'Last-Event-ID must be the id of an event received earlier (a whole number).');
  return BigInt(raw);
}

/** `exp` and `ver` of the (already verified) access token in the Authorization header. */
function tokenClaims(req: Request): { exp: number | null; ver: number | null } {
  const token = /^Bearer\s+(\S+)$/i.exec(req.headers.authorization ?? '')?.[1];
  try {
    const claims = JSON.parse(Buffer.from(token?.split('.')[1] ?? '', 'base64url').toString('utf8')) as { exp?: unknown; ver?: unknown };
    return { exp: typeof claims.exp === 'number' ? claims.exp : null, ver: typeof claims.ver === 'number' ? claims.ver : null };
  } catch {
    return { exp: null, ver: null };
  }
}

/** Who may open which live stream; the hub does the streaming. */
@Injectable()
export class LiveService {
  constructor(
    private readonly em: EntityManager,
    private readonly mapAccess: MapAccessService,
    private readonly links: ViewingLinksService,
    private readonly hub: LiveHubService,
    private readonly clock: Clock,
  ) {}

  /**
   * A member's stream (viewer and up). Non-members get the same 404 as for the map itself. The stream ends
   * when the access token expires, or at a heartbeat after the membership is gone, the map is in the bin or
   * the password changed; the client reconnects (with a fresh token) and catches up by Last-Event-ID.
   */
  async memberStream(mapId: string, caller: AuthUser, lastEventId: bigint | null, req: Request, res: Response): Promise<void> {
    const { map } = await this.mapAccess.load(mapId, caller.id, 'viewer');
    const { exp, ver } = tokenClaims(req);
    const sql = `select 1 as ok from maps m join memberships ms on ms.team_id = m.team_id join users u on u.id = ms.user_id
      where m.id = ? and ms.user_id = ? and m.deleted_at is null${ver === null ? '' : ' and u.token_version = ?'}`;
    const params = ver === null ? [map.id, caller.id] : [map.id, caller.id, ver];
    await this.hub.open(req, res, {
      mapId: map.id,
      userId: caller.id,
      shared: null,
      lastEventId,
      endsAt: exp === null ? null : new Date(exp * 1000),
      stillAllowed: async () => (await this.em.execute(sql, params)).length > 0,
    });
  }

  /**
   * A viewing-link holder's stream: the same checks as `GET /api/view/:token` (404 unknown or revoked,
   * 410 expired), without counting a view. It ends at a heartbeat once the link is revoked or expired.
   */
  async linkStream(token: string, lastEventId: bigint | null, req: Request, res: Response): Promise<void> {
    const link = await this.links.findUsable(token);
    const sql = `select 1 as ok from viewing_links l join maps m on m.id = l.map_id
      where l.id = ? and l.revoked_at is null and m.deleted_at is null and (l.expires_at is null or l.expires_at > ?)`;
    await this.hub.open(req, res, {
      mapId: link.map.id,
      userId: null,
      shared: { includePins: link.includePins },
      lastEventId,
      endsAt: link.expiresAt,
      stillAllowed: async () => (await this.em.execute(sql, [link.id, this.clock.now()])).length > 0,
    });
  }
}
