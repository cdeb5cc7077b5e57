import { GoneException, Injectable, NotFoundException } from '@nestjs/common';
import { EntityManager } from '@mikro-orm/postgresql';
import type { CreatedViewingLink, MapSetup, SharedMapView, ViewingLinkView } from '@fieldbound/shared';
import { Clock } from '../common/clock';
import type { AuthUser } from '../common/current-user.decorator';
import { fieldError } from '../common/validation';
import { MapAccessService } from '../maps/map-access.service';
import { personRef } from '../maps/map.views';
import { PinReads } from '../pins/pin.reads';
import { selectRows } from '../common/sql-reads';
import { SpeciesReads } from '../species/species.reads';
import { sharedSpecies } from '../species/species.views';
import { User } from '../users/user.entity';
import type { CreateViewingLinkDto } from './dto/viewing-link.dto';
import { ViewingLink } from './viewing-link.entity';
import { hashViewingToken, looksLikeViewingToken, newViewingToken } from './viewing-link-token';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

function toLinkView(link: ViewingLink): ViewingLinkView {
  return {
    id: link.id,
    mapId: link.map.id,
    createdBy: personRef(link.createdBy),
    createdAt: link.createdAt.toISOString(),
    expiresAt: link.expiresAt?.toISOString() ?? null,
    includePins: link.includePins,
    viewCount: link.viewCount,
    lastViewedAt: link.lastViewedAt?.toISOString() ?? null,
    revokedAt: link.revokedAt?.toISOString() ?? null,
  };
}

/** Unknown, revoked, and links to maps in the bin all look the same from outside. */
function linkNotFound(): NotFoundException {
  return new NotFoundException({ statusCode: 404, code: 'viewing_link_not_found', message: 'This viewing link does not exist or was revoked.' });
}

function linkExpired(): GoneException {
  return new GoneException({ statusCode: 410, code: 'viewing_link_expired', message: 'This viewing link has expired. Ask the person who shared it for a new one.' });
}

/** Read-only links to one map for people without an account. */
@Injectable()
export class ViewingLinksService {
  constructor(
    private readonly em: EntityManager,
    private readonly mapAccess: MapAccessService,
    private readonly clock: Clock,
    private readonly pins: PinReads,
    private readonly species: SpeciesReads,
  ) {}

  async list(mapId: string, caller: AuthUser): Promise<ViewingLinkView[]> {
    const { map } = await this.mapAccess.load(mapId, caller.id, 'editor');
    const links = await this.em.find(ViewingLink, { map }, { populate: ['createdBy'], orderBy: { createdAt: 'desc', id: 'asc' } });
    return links.map(toLinkView);
  }

  /** Creates a link; the answer is the only place the token ever appears. */
  async create(mapId: string, caller: AuthUser, dto: CreateViewingLinkDto): Promise<CreatedViewingLink> {
    const { map } = await this.mapAccess.load(mapId, caller.id, 'editor');
    const now = this.clock.now();
    let expiresAt: Date | null = null;
    if (dto.expiresAt) {
      expiresAt = new Date(dto.expiresAt);
      if (!(expiresAt.getTime() > now.getTime())) throw fieldError('expiresAt', 'The expiry must be in the future.');
    }
    const { token, hash } = newViewingToken();
    const link = new ViewingLink(map, hash, await this.em.findOneOrFail(User, caller.id), now);
    link.expiresAt = expiresAt;
    link.includePins = dto.includePins ?? false;
    this.em.persist(link);
    await this.em.flush();
    return { link: toLinkView(link), token, path: `/view/${token}` };
  }

  async revoke(mapId: string, linkId: string, caller: AuthUser): Promise<void> {
    const { map } = await this.mapAccess.load(mapId, caller.id, 'editor');
    const link = UUID.test(linkId) ? await this.em.findOne(ViewingLink, { id: linkId.toLowerCase(), map }) : null;
    if (!link) throw linkNotFound();
    if (link.revokedAt) return;
    link.revokedAt = this.clock.now();
    link.revokedBy = this.em.getReference(User, caller.id);
    await this.em.flush();
  }

  /**
   * What a link holder may see: title, description, setup, the species its overlay names (from the catalogue and the
   * map's own team lists only) and (if the link allows) pins. Counts the view.
   * Unknown or revoked → 404; expired → 410.
   */
  async view(token: string): Promise<SharedMapView> {
    if (!looksLikeViewingToken(token)) throw linkNotFound();
    const now = this.clock.now();
    // The busiest public read, in plain SQL (common/sql-reads.ts): find the link with its live map and count the
    // view in one statement — counted in the database, so simultaneous views are all counted; an expired link is
    // found but not counted.
    const rows = await selectRows<{ map_id: string; team_id: string; include_pins: boolean; expired: boolean; title: string; description: string; setup: MapSetup }>(
      this.em,
      `with link as (
         select l.id, l.map_id, l.include_pins, (l.expires_at is not null and l.expires_at <= ?) as expired
         from viewing_links l join maps m on m.id = l.map_id
         where l.token_hash = ? and l.revoked_at is null and m.deleted_at is null),
       counted as (
         update viewing_links v set view_count = v.view_count + 1, last_viewed_at = ?
         from link where v.id = link.id and not link.expired returning v.id)
       select link.map_id, m.team_id, link.include_pins, link.expired, m.title, m.description, m.setup
       from link join maps m on m.id = link.map_id left join counted on counted.id = link.id`,
      [now, hashViewingToken(token), now],
    );
    const link = rows[0];
    if (!link) throw linkNotFound();
    if (link.expired) throw linkExpired();
    const species = (await this.species.namedForTeam(link.team_id, link.setup.species)).map(sharedSpecies);
    const pins = link.include_pins ? await this.pins.sharedForMap(link.map_id) : null;
    return { title: link.title, description: link.description, setup: link.setup, species, pins };
  }

  /** The link behind a token, with its map, if it may be used now. Unknown or revoked → 404; expired → 410. Counts nothing. */
  async findUsable(token: string): Promise<ViewingLink> {
    if (!looksLikeViewingToken(token)) throw linkNotFound();
    const link = await this.em.findOne(ViewingLink, { tokenHash: hashViewingToken(token) }, { populate: ['map'] });
    if (!link || link.revokedAt || link.map.deletedAt) throw linkNotFound();
    if (link.expiresAt && link.expiresAt.getTime() <= this.clock.now().getTime()) throw linkExpired();
    return link;
  }
}
