import { Injectable } from '@nestjs/common';
import type { EntityManager } from '@mikro-orm/postgresql';
import { parseSetup, type PinGeometry } from '@fieldbound/shared';
import { PasswordService } from '../auth/password.service';
import { User } from '../users/user.entity';
import { Team } from '../teams/team.entity';
import { Membership } from '../teams/membership.entity';
import { SavedMap } from '../maps/map.entity';
import { MapVersion } from '../maps/map-version.entity';
import { Pin } from '../pins/pin.entity';
import { PinReply } from '../pins/pin-reply.entity';
import { ViewingLink } from '../viewing-links/viewing-link.entity';
import { hashViewingToken } from '../viewing-links/viewing-link-token';
import { CatalogueSpecies } from '../species/catalogue-species.entity';
import { DEMO_LECTURE_TOKEN, DEMO_PEOPLE, DEMO_TEAM_NAME, type DemoPersonKey } from './demo-people';
import { DEMO_MAPS } from './demo-maps';
import { DEMO_PINS, type DemoPin } from './demo-threads';

const HOUR = 3_600_000;
const DAY = 24 * HOUR;

/**
 * Writes the invented demo scenario — a research group, its maps, pinned threads and a lecture link —
 * in one transaction, so a crash never leaves half a demo behind. Runs once: an existing demo owner
 * account means the demo is there (pass `reset` to remove it and seed again).
 */
@Injectable()
export class DemoSeeder {
  constructor(private readonly passwords: PasswordService) {}

  async run(rootEm: EntityManager, { reset = false }: { reset?: boolean } = {}): Promise<string> {
    return rootEm.fork().transactional(async (em) => {
      const emails = Object.values(DEMO_PEOPLE).map((p) => p.email);
      const existing = await em.find(User, { email: { $in: emails } });
      if (existing.length && !reset) return 'demo data already present; nothing seeded (use --reset to seed it again)';
      if (existing.length) await this.remove(em, existing);
      const summary = await this.seed(em, new Date());
      return `${reset && existing.length ? 're-seeded' : 'seeded'} the demo: ${summary}`;
    });
  }

  private async remove(em: EntityManager, users: User[]): Promise<void> {
    const memberships = await em.find(Membership, { user: { $in: users } }, { populate: ['team'] });
    const teamIds = [...new Set(memberships.filter((m) => m.team.name === DEMO_TEAM_NAME).map((m) => m.team.id))];
    // Teams own maps, pins, replies and links through cascading foreign keys.
    if (teamIds.length) await em.nativeDelete(Team, { id: { $in: teamIds } });
    await em.nativeDelete(User, { id: { $in: users.map((u) => u.id) } });
  }

  private async seed(em: EntityManager, now: Date): Promise<string> {
    const people = {} as Record<DemoPersonKey, User>;
    for (const [key, person] of Object.entries(DEMO_PEOPLE) as [DemoPersonKey, (typeof DEMO_PEOPLE)[DemoPersonKey]][]) {
      people[key] = new User(person.email, person.displayName, await this.passwords.hash(person.password));
      em.persist(people[key]);
    }
    const team = new Team(DEMO_TEAM_NAME);
    em.persist(team);
    for (const [key, person] of Object.entries(DEMO_PEOPLE) as [DemoPersonKey, (typeof DEMO_PEOPLE)[DemoPersonKey]][]) {
      em.persist(new Membership(team, people[key], person.role));
    }

    const maps = {} as Record<(typeof DEMO_MAPS)[number]['key'], SavedMap>;
    DEMO_MAPS.forEach((spec, index) => {
      // Spread creation over the past weeks so the list reads like real work.
      const created = new Date(now.getTime() - (20 - index * 3) * DAY);
      const map = new SavedMap(team, spec.title, parseSetup(spec.setup), people[spec.author], created);
      map.description = spec.description;
      map.tags = [...spec.tags];
      maps[spec.key] = map;
      em.persist([map, new MapVersion(map, people[spec.author], created)]);
    });

    const catalogue = new Map((await em.find(CatalogueSpecies, {})).map((s) => [s.symbol, s]));
    let replyCount = 0;
    for (const spec of DEMO_PINS) {
      const opened = new Date(now.getTime() - spec.daysAgo * DAY);
      const pin = new Pin(maps[spec.map], people[spec.author], pinGeometry(spec, catalogue), spec.title, opened);
      pin.body = spec.body;
      pin.category = spec.category;
      em.persist(pin);
      for (const reply of spec.replies) {
        em.persist(new PinReply(pin, people[reply.author], reply.body, new Date(opened.getTime() + reply.afterHours * HOUR)));
        replyCount++;
      }
      if (spec.resolvedBy) {
        const last = spec.replies.at(-1)?.afterHours ?? 1;
        pin.status = 'resolved';
        pin.resolvedBy = people[spec.resolvedBy];
        pin.resolvedAt = new Date(opened.getTime() + last * HOUR);
        pin.updatedBy = people[spec.resolvedBy];
        pin.updatedAt = pin.resolvedAt;
      }
    }

    const lecture = new ViewingLink(maps.lab, hashViewingToken(DEMO_LECTURE_TOKEN), people.owner, new Date(now.getTime() - DAY));
    lecture.includePins = true;
    em.persist(lecture);
    await em.flush();
    return `team "${DEMO_TEAM_NAME}", ${Object.keys(people).length} people, ${DEMO_MAPS.length} maps, ${DEMO_PINS.length} pins with ${replyCount} replies, lecture link /view/${DEMO_LECTURE_TOKEN}`;
  }
}

function pinGeometry(spec: DemoPin, catalogue: Map<string, CatalogueSpecies>): PinGeometry {
  const g = spec.geometry;
  if (!('alphaOf' in g)) return g;
  const atom = catalogue.get(g.alphaOf);
  if (!atom) throw new Error(`demo pin "${spec.title}" names ${g.alphaOf}, which is not in the species catalogue`);
  return { kind: 'point', at: { alpha: atom.polarizabilityA0, fieldTesla: g.fieldTesla } };
}
