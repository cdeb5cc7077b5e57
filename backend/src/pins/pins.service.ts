import { BadRequestException, ForbiddenException, Injectable, Logger, NotFoundException } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { EntityManager, OptimisticLockError } from '@mikro-orm/postgresql';
import { canonicalJson, type PinDetail, type PinGeometry, type PinReplyView, type PinView } from '@fieldbound/shared';
import { Clock } from '../common/clock';
import type { AuthUser } from '../common/current-user.decorator';
import type { AppConfig } from '../config/configuration';
import { MapEventsService } from '../live/map-events.service';
import { MailService } from '../mail/mail.service';
import { MapAccessService } from '../maps/map-access.service';
import { versionConflict } from '../maps/map-errors';
import { SavedMap } from '../maps/map.entity';
import { Membership } from '../teams/membership.entity';
import { roleAtLeast, type TeamRole } from '../teams/team-role';
import { User } from '../users/user.entity';
import type { CreatePinDto, CreateReplyDto, UpdatePinDto } from './dto/pin.dto';
import { mentionMail } from './mention-mail';
import { mentionedEmails } from './mentions';
import { checkPinGeometry } from './pin-geometry';
import { PinReply } from './pin-reply.entity';
import { Pin } from './pin.entity';
import { PinReads } from './pin.reads';
import { toPinView, toReplyView } from './pin.views';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

function pinNotFound(): NotFoundException {
  return new NotFoundException({ statusCode: 404, code: 'pin_not_found', message: 'No such pin, or you are not a member of its team.' });
}

function geometryOrThrow(value: unknown): PinGeometry {
  const check = checkPinGeometry(value);
  if (check.ok) return check.geometry;
  throw new BadRequestException({ statusCode: 400, message: 'The pin geometry has problems.', errors: check.errors });
}

/** A mention to notify once the change it belongs to is stored. */
interface PendingMention {
  pin: { id: string; title: string };
  map: { id: string; title: string; teamId: string };
  author: { email: string; displayName: string };
  text: string;
  previousText: string | null;
  inReply: boolean;
}

/**
 * Pins and their threads. Viewers read and reply; editors create, move, edit, resolve and delete.
 * Mentions (`@name@example.org`) of team members are e-mailed after the change is stored.
 */
@Injectable()
export class PinsService {
  private readonly logger = new Logger('pins');

  constructor(
    private readonly em: EntityManager,
    private readonly mapAccess: MapAccessService,
    private readonly mail: MailService,
    private readonly config: ConfigService<AppConfig, true>,
    private readonly clock: Clock,
    private readonly events: MapEventsService,
    private readonly reads: PinReads,
  ) {}

  async list(mapId: string, caller: AuthUser, status?: 'open' | 'resolved'): Promise<PinView[]> {
    await this.mapAccess.requireRoleForMap(mapId, caller.id, 'viewer');
    return this.reads.listForMap(mapId.toLowerCase(), status);
  }

  async create(mapId: string, caller: AuthUser, dto: CreatePinDto): Promise<PinView> {
    // The access check and the author's name come from one plain statement; the map and the author are only
    // references here (nothing else of them is read or written), so the unit of work holds just the new pin.
    const access = await this.mapAccess.requireRoleForMap(mapId, caller.id, 'editor');
    const geometry = geometryOrThrow(dto.geometry);
    const pin = new Pin(this.em.getReference(SavedMap, access.mapId), this.em.getReference(User, caller.id), geometry, dto.title, this.clock.now());
    pin.body = dto.body ?? '';
    pin.category = dto.category ?? null;
    this.em.persist(pin);
    const view = () => ({ ...toPinView(pin), author: { id: caller.id, displayName: access.caller.displayName } });
    await this.events.flushAndRecord(this.em, access.mapId, () => ({ kind: 'pin.created', actorId: caller.id, data: { pin: view() } }));
    await this.notifyMentions({ pin, map: { id: access.mapId, title: access.mapTitle, teamId: access.teamId }, author: access.caller, text: pin.body, previousText: null, inReply: false });
    return view();
  }

  async get(pinId: string, caller: AuthUser): Promise<PinDetail> {
    const pin = UUID.test(pinId) ? await this.reads.pin(pinId.toLowerCase()) : null;
    if (!pin) throw pinNotFound();
    await this.requirePinAccess(pin.mapId, caller, 'viewer');
    return this.reads.detail(pin);
  }

  /** Edits, moves, resolves or reopens a pin based on `expectedVersion`; a stale one gets 409 with the current pin. */
  async update(pinId: string, caller: AuthUser, dto: UpdatePinDto): Promise<PinView> {
    const { pin, map } = await this.load(pinId, caller, 'editor');
    if (dto.expectedVersion !== pin.version) throw versionConflict('pin', toPinView(pin));
    const previousBody = pin.body;
    const by = await this.em.findOneOrFail(User, caller.id);
    const now = this.clock.now();
    const geometry = dto.geometry === undefined ? undefined : geometryOrThrow(dto.geometry);
    let changed = false;
    const set = <K extends 'geometry' | 'title' | 'body' | 'category'>(key: K, value: Pin[K] | undefined) => {
      if (value === undefined || canonicalJson(value) === canonicalJson(pin[key])) return;
      pin[key] = value;
      changed = true;
    };
    set('geometry', geometry);
    set('title', dto.title);
    set('body', dto.body);
    set('category', dto.category);
    if (dto.status !== undefined && dto.status !== pin.status) {
      pin.status = dto.status;
      pin.resolvedAt = dto.status === 'resolved' ? now : null;
      pin.resolvedBy = dto.status === 'resolved' ? by : null;
      changed = true;
    }
    // Saving the same content again changes nothing, not even the version.
    if (!changed) return toPinView(pin);
    pin.updatedAt = now;
    pin.updatedBy = by;
    try {
      // MikroORM adds `where version = ?` and bumps the version: a concurrent writer loses here.
      await this.events.flushAndRecord(this.em, map.id, () => ({ kind: 'pin.updated', actorId: caller.id, data: { pin: toPinView(pin) } }));
    } catch (error) {
      if (!(error instanceof OptimisticLockError)) throw error;
      this.em.clear();
      const current = await this.em.findOne(Pin, { id: pin.id }, { populate: ['author', 'resolvedBy'] });
      if (!current) throw pinNotFound();
      throw versionConflict('pin', toPinView(current));
    }
    await this.notifyMentions({ pin, map: { id: map.id, title: map.title, teamId: map.team.id }, author: by, text: pin.body, previousText: previousBody, inReply: false });
    return toPinView(pin);
  }

  async remove(pinId: string, caller: AuthUser): Promise<void> {
    const { pin, map } = await this.load(pinId, caller, 'editor');
    this.em.remove(pin);
    await this.events.flushAndRecord(this.em, map.id, () => ({ kind: 'pin.deleted', actorId: caller.id, data: { pinId: pin.id } }));
  }

  async reply(pinId: string, caller: AuthUser, dto: CreateReplyDto): Promise<PinReplyView> {
    // Plain-statement access check (see create); the unit of work holds just the new reply.
    const found = UUID.test(pinId) ? await this.reads.mapOfPin(pinId.toLowerCase()) : null;
    if (!found) throw pinNotFound();
    const access = await this.requirePinAccess(found.mapId, caller, 'viewer');
    const reply = new PinReply(this.em.getReference(Pin, found.pinId), this.em.getReference(User, caller.id), dto.body, this.clock.now());
    this.em.persist(reply);
    const view: PinReplyView = { id: reply.id, author: { id: caller.id, displayName: access.caller.displayName }, body: reply.body, createdAt: reply.createdAt.toISOString() };
    await this.events.flushAndRecord(this.em, access.mapId, async (tx) => ({
      kind: 'pin.replied',
      actorId: caller.id,
      data: { pinId: found.pinId, reply: view, replyCount: await tx.count(PinReply, { pin: found.pinId }) },
    }));
    await this.notifyMentions({
      pin: { id: found.pinId, title: found.title },
      map: { id: access.mapId, title: access.mapTitle, teamId: access.teamId },
      author: access.caller,
      text: reply.body,
      previousText: null,
      inReply: true,
    });
    return view;
  }

  /** A reply can be removed by its author, or by an editor or owner. */
  async removeReply(pinId: string, replyId: string, caller: AuthUser): Promise<void> {
    const { pin, membership } = await this.load(pinId, caller, 'viewer');
    const reply = UUID.test(replyId) ? await this.em.findOne(PinReply, { id: replyId.toLowerCase(), pin }) : null;
    if (!reply) throw new NotFoundException({ statusCode: 404, code: 'reply_not_found', message: 'This pin has no such reply.' });
    if (reply.author?.id !== caller.id && !roleAtLeast(membership.role, 'editor')) {
      throw new ForbiddenException({ statusCode: 403, code: 'not_reply_author', message: 'Only its author or an editor can delete a reply.' });
    }
    this.em.remove(reply);
    // No event kind for a removed reply: the pin as it is now carries the new reply count.
    await this.events.flushAndRecord(this.em, pin.map.id, async (tx) => ({
      kind: 'pin.updated',
      actorId: caller.id,
      data: { pin: { ...toPinView(pin), replyCount: await tx.count(PinReply, { pin: pin.id }) } },
    }));
  }

  /** The plain-statement access check for a pin's map: a pin on a map the caller may not see is "no such pin". */
  private async requirePinAccess(mapId: string, caller: AuthUser, minimumRole: TeamRole) {
    try {
      return await this.mapAccess.requireRoleForMap(mapId, caller.id, minimumRole);
    } catch (error) {
      if (error instanceof NotFoundException) throw pinNotFound();
      throw error;
    }
  }

  private async load(pinId: string, caller: AuthUser, minimumRole: TeamRole): Promise<{ pin: Pin; map: SavedMap; membership: Membership }> {
    if (!UUID.test(pinId)) throw pinNotFound();
    const pin = await this.em.findOne(Pin, { id: pinId.toLowerCase() }, { populate: ['author', 'resolvedBy'] });
    if (!pin) throw pinNotFound();
    try {
      const { map, membership } = await this.mapAccess.load(pin.map.id, caller.id, minimumRole);
      return { pin, map, membership };
    } catch (error) {
      if (error instanceof NotFoundException) throw pinNotFound();
      throw error;
    }
  }

  /**
   * E-mails each team member newly mentioned in `text` (not the author, not someone already mentioned in
   * `previousText`). Sending never fails the request: a failure is logged by the mail service.
   */
  private async notifyMentions(m: PendingMention): Promise<void> {
    const before = new Set(m.previousText ? mentionedEmails(m.previousText) : []);
    const emails = mentionedEmails(m.text).filter((e) => !before.has(e) && e !== m.author.email);
    if (emails.length === 0) return;
    const members = await this.em.find(Membership, { team: m.map.teamId, user: { email: { $in: emails } } }, { populate: ['user'] });
    const publicUrl = this.config.get('publicUrl', { infer: true });
    const link = `${publicUrl}/maps/${m.map.id}?pin=${m.pin.id}`;
    await Promise.all(
      members.map((member) =>
        this.mail.sendInBackground(
          mentionMail({ to: member.user.email, authorName: m.author.displayName, mapTitle: m.map.title, pinTitle: m.pin.title, text: m.text, link, inReply: m.inReply }),
        ),
      ),
    );
    if (members.length) this.logger.log({ event: 'pins.mentions_sent', pin: m.pin.id, count: members.length });
  }
}
