import { BadRequestException, Injectable, NotFoundException } from '@nestjs/common';
import { EntityManager, UniqueConstraintViolationException } from '@mikro-orm/postgresql';
import { InjectRepository } from '@mikro-orm/nestjs';
import {
  type DeletedMapItem, MAP_LIMITS, type MapDetail, type MapDiffResponse, type MapListResponse, type MapVersionDetail,
  type MapVersionSummary, type ResultSummary,
} from '@fieldbound/shared';
import { Clock } from '../common/clock';
import { MapEventsService } from '../live/map-events.service';
import type { UploadedBytes } from '../common/uploaded-file';
import type { AuthUser } from '../common/current-user.decorator';
import { fieldError } from '../common/validation';
import { TeamAccessService } from '../teams/team-access.service';
import { roleAtLeast } from '../teams/team-role';
import type { Team } from '../teams/team.entity';
import { User } from '../users/user.entity';
import type { CreateMapDto, DuplicateMapDto, ListMapsQueryDto, PutResultSummaryDto, RestoreVersionDto, UpdateMapDto } from './dto/map.dto';
import { MapAccessService, mapNotFound } from './map-access.service';
import { diffMapContent } from './map-diff';
import { isPng, restoreWindowPassed, validSetupOrThrow, versionConflict } from './map-errors';
import { SavedMap } from './map.entity';
import { MapRepository } from './map.repository';
import { MapReads } from './map.reads';
import { MapResultSummary } from './map-result-summary.entity';
import { MapThumbnail } from './map-thumbnail.entity';
import { MapVersion } from './map-version.entity';
import { toDeletedMapItem, toMapDetail, toMapListItem, toVersionDetail } from './map.views';

const DAY_MS = 86_400_000;
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Saved maps: content with numbered versions, optimistic locking, soft delete, summaries and thumbnails. */
@Injectable()
export class MapsService {
  constructor(
    private readonly em: EntityManager,
    @InjectRepository(SavedMap) private readonly maps: MapRepository,
    private readonly mapAccess: MapAccessService,
    private readonly teamAccess: TeamAccessService,
    private readonly clock: Clock,
    private readonly events: MapEventsService,
    private readonly reads: MapReads,
  ) {}

  async list(teamId: string, query: ListMapsQueryDto): Promise<MapListResponse> {
    const sort = query.sort ?? 'updatedAt';
    return this.reads.listForTeam(teamId.toLowerCase(), {
      search: query.search || undefined,
      tag: query.tag,
      sort,
      order: query.order ?? (sort === 'title' ? 'asc' : 'desc'),
      limit: query.limit ?? 50,
      offset: query.offset ?? 0,
    });
  }

  async create(team: Team, caller: AuthUser, dto: CreateMapDto): Promise<MapDetail> {
    const setup = validSetupOrThrow(dto.setup);
    const author = await this.em.findOneOrFail(User, caller.id);
    const now = this.clock.now();
    const map = new SavedMap(team, dto.title, setup, author, now);
    map.description = dto.description ?? '';
    map.tags = dto.tags ?? [];
    this.em.persist([map, new MapVersion(map, author, now)]);
    await this.em.flush();
    return toMapDetail(map);
  }

  async get(mapId: string, caller: AuthUser): Promise<MapDetail> {
    // Viewer is the lowest role, so any member may read: the map and the caller's membership in one statement.
    const found = UUID.test(mapId) ? await this.reads.detailWithRole(mapId.toLowerCase(), caller.id) : null;
    if (!found?.role) throw mapNotFound();
    return found.detail;
  }

  /** Applies an edit based on `expectedVersion`; a stale one gets 409 with the current map. */
  async update(mapId: string, caller: AuthUser, dto: UpdateMapDto): Promise<MapDetail> {
    // Check access and the version with one plain statement first: a stale save (common when several people
    // edit one map) answers its 409 with the current map without loading entities.
    const current = UUID.test(mapId) ? await this.reads.detailWithRole(mapId.toLowerCase(), caller.id) : null;
    if (!current?.role) throw mapNotFound();
    if (!roleAtLeast(current.role, 'editor')) await this.teamAccess.requireRole(current.detail.teamId, caller.id, 'editor');
    if (dto.expectedVersion !== current.detail.version) throw versionConflict('map', current.detail);
    // The entity alone (no people, summary or thumbnail): the answer is read back in plain SQL after the save.
    const map = await this.em.findOne(SavedMap, { id: current.detail.id, deletedAt: null });
    if (!map) throw mapNotFound();
    if (dto.expectedVersion !== map.version) throw versionConflict('map', (await this.reads.detailWithRole(map.id, caller.id))?.detail ?? current.detail);
    const setup = dto.setup === undefined ? undefined : validSetupOrThrow(dto.setup);
    const before = { title: map.title, description: map.description, tags: map.tags, setup: map.setup };
    const after = {
      title: dto.title ?? map.title,
      description: dto.description ?? map.description,
      tags: dto.tags ?? map.tags,
      setup: setup ?? map.setup,
    };
    // Saving the same content again makes no new version.
    if (diffMapContent(before, after).length === 0) return current.detail;
    Object.assign(map, after);
    return this.saveNewVersion(map, caller, {});
  }

  async remove(mapId: string, caller: AuthUser): Promise<void> {
    const { map } = await this.mapAccess.load(mapId, caller.id, 'editor');
    map.deletedAt = this.clock.now();
    map.deletedBy = this.em.getReference(User, caller.id);
    await this.em.flush();
  }

  async listDeleted(teamId: string): Promise<DeletedMapItem[]> {
    const maps = await this.maps.listDeleted(teamId);
    const cutoff = this.clock.now().getTime() - MAP_LIMITS.restoreWindowDays * DAY_MS;
    return maps.filter((m) => m.deletedAt!.getTime() > cutoff).map(toDeletedMapItem);
  }

  /** Takes a map out of the bin (owners, within the restore window). */
  async restoreDeleted(mapId: string, caller: AuthUser): Promise<MapDetail> {
    const { map } = await this.mapAccess.load(mapId, caller.id, 'owner', { includeDeleted: true });
    if (!map.deletedAt) return toMapDetail(map);
    if (map.deletedAt.getTime() <= this.clock.now().getTime() - MAP_LIMITS.restoreWindowDays * DAY_MS) throw restoreWindowPassed();
    map.deletedAt = null;
    map.deletedBy = null;
    await this.em.flush();
    return toMapDetail(map);
  }

  /** Copies a map (its current content, as version 1) into its own team or another team where the caller edits. */
  async duplicate(mapId: string, caller: AuthUser, dto: DuplicateMapDto): Promise<MapDetail> {
    const { map: source } = await this.mapAccess.load(mapId, caller.id, 'viewer');
    // Editor or owner in the target team (the map's own team by default): 404 outside it, 403 below editor.
    const target = (await this.teamAccess.requireRole(dto.teamId ?? source.team.id, caller.id, 'editor')).team;
    const author = await this.em.findOneOrFail(User, caller.id);
    const now = this.clock.now();
    const title = dto.title ?? `${source.title} (copy)`.slice(0, MAP_LIMITS.maxTitleLength);
    const copy = new SavedMap(target, title, structuredClone(source.setup), author, now);
    copy.description = source.description;
    copy.tags = [...source.tags];
    const first = new MapVersion(copy, author, now);
    first.duplicatedFromMapId = source.id;
    first.duplicatedFromVersion = source.version;
    this.em.persist([copy, first]);
    await this.em.flush();
    return toMapDetail(copy);
  }

  async versions(mapId: string, caller: AuthUser): Promise<MapVersionSummary[]> {
    await this.mapAccess.requireRoleForMap(mapId, caller.id, 'viewer');
    return this.reads.versionSummaries(mapId.toLowerCase());
  }

  async version(mapId: string, caller: AuthUser, number: number): Promise<MapVersionDetail> {
    const { map } = await this.mapAccess.load(mapId, caller.id, 'viewer');
    return toVersionDetail(await this.findVersion(map, number));
  }

  async diff(mapId: string, caller: AuthUser, from: number, to: number): Promise<MapDiffResponse> {
    const { map } = await this.mapAccess.load(mapId, caller.id, 'viewer');
    const [a, b] = [await this.findVersion(map, from), await this.findVersion(map, to)];
    return { from, to, changes: diffMapContent(a, b) };
  }

  /** Makes an earlier version's content the newest version (history is never rewritten). */
  async restoreVersion(mapId: string, caller: AuthUser, number: number, dto: RestoreVersionDto): Promise<MapDetail> {
    const { map } = await this.mapAccess.load(mapId, caller.id, 'editor');
    if (dto.expectedVersion !== map.version) throw versionConflict('map', toMapDetail(map));
    const old = await this.findVersion(map, number);
    map.title = old.title;
    map.description = old.description;
    map.tags = [...old.tags];
    map.setup = structuredClone(old.setup);
    return this.saveNewVersion(map, caller, { restoredFrom: number });
  }

  async putSummary(mapId: string, caller: AuthUser, dto: PutResultSummaryDto): Promise<ResultSummary> {
    const { map } = await this.mapAccess.load(mapId, caller.id, 'editor');
    const by = await this.em.findOneOrFail(User, caller.id);
    const init = { engineVersion: dto.engineVersion, setupFingerprint: dto.setupFingerprint, counts: { bound: dto.counts.bound, resonance: dto.counts.resonance, unbound: dto.counts.unbound }, computationMs: dto.computationMs };
    const existing = map.summary?.unwrap();
    if (existing) {
      Object.assign(existing, init, { computedBy: by, computedAt: this.clock.now() });
    } else {
      const summary = new MapResultSummary(map, init, by, this.clock.now());
      map.summary = summary as never;
      this.em.persist(summary);
    }
    await this.em.flush();
    return toMapListItem(map).summary!;
  }

  async putThumbnail(mapId: string, caller: AuthUser, file: UploadedBytes | undefined): Promise<{ thumbnailUrl: string }> {
    const { map } = await this.mapAccess.load(mapId, caller.id, 'editor');
    if (!file) throw fieldError('file', 'Attach the thumbnail as a PNG file in the "file" field.');
    if (file.size > MAP_LIMITS.maxThumbnailBytes) throw fieldError('file', `A thumbnail has at most ${MAP_LIMITS.maxThumbnailBytes / 1024} KB.`);
    if (!isPng(file.buffer)) throw fieldError('file', 'The thumbnail must be a PNG image.');
    const now = this.clock.now();
    const existing = await this.em.findOne(MapThumbnail, { map });
    if (existing) {
      existing.png = Buffer.from(file.buffer);
      existing.byteSize = file.buffer.length;
      existing.updatedAt = now;
    } else {
      this.em.persist(new MapThumbnail(map, Buffer.from(file.buffer), now));
    }
    await this.em.flush();
    return { thumbnailUrl: `/api/maps/${map.id}/thumbnail?v=${now.getTime()}` };
  }

  async getThumbnail(mapId: string, caller: AuthUser): Promise<Buffer> {
    const { map } = await this.mapAccess.load(mapId, caller.id, 'viewer');
    const thumbnail = await this.em.findOne(MapThumbnail, { map }, { populate: ['png'] });
    if (!thumbnail) throw new NotFoundException({ statusCode: 404, code: 'thumbnail_not_found', message: 'This map has no thumbnail yet.' });
    return thumbnail.png;
  }

  /**
   * Bumps the version and snapshots the content in one flush. Two writers based on the same version both
   * try to add the same version number; the unique (map, number) index lets one win, the other gets 409.
   */
  private async saveNewVersion(map: SavedMap, caller: AuthUser, marks: { restoredFrom?: number }): Promise<MapDetail> {
    const author = this.em.getReference(User, caller.id);
    const now = this.clock.now();
    map.version += 1;
    map.updatedBy = author;
    map.updatedAt = now;
    const snapshot = new MapVersion(map, author, now);
    snapshot.restoredFrom = marks.restoredFrom ?? null;
    this.em.persist(snapshot);
    try {
      await this.events.flushAndRecord(this.em, map.id, () => ({
        kind: 'map.saved',
        actorId: caller.id,
        data: { version: map.version, title: map.title, updatedAt: now.toISOString() },
      }));
    } catch (error) {
      if (!(error instanceof UniqueConstraintViolationException)) throw error;
      this.em.clear();
      const current = await this.maps.findLive(map.id);
      if (!current) throw mapNotFound();
      throw versionConflict('map', toMapDetail(current));
    }
    const saved = await this.reads.detailWithRole(map.id, caller.id);
    if (!saved) throw mapNotFound();
    return saved.detail;
  }

  private async findVersion(map: SavedMap, number: number): Promise<MapVersion> {
    if (!Number.isInteger(number) || number < 1) throw new BadRequestException({ statusCode: 400, message: 'A version number is a whole number from 1.', errors: { number: ['A version number is a whole number from 1.'] } });
    const version = await this.em.findOne(MapVersion, { map, number }, { populate: ['createdBy'] });
    if (!version) throw new NotFoundException({ statusCode: 404, code: 'version_not_found', message: `This map has no version ${number}.` });
    return version;
  }
}
