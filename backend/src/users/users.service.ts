import { Injectable } from '@nestjs/common';
import { EntityManager } from '@mikro-orm/postgresql';
import { AuditService, type AuditEventView } from '../audit/audit.service';
import { Membership } from '../teams/membership.entity';
import { User } from './user.entity';
import { toUserView, type UserView } from './user.view';

import type { MeView } from '@fieldbound/shared';

export type { MeView };

@Injectable()
export class UsersService {
  constructor(
    private readonly em: EntityManager,
    private readonly audit: AuditService,
  ) {}

  /** The signed-in person and the teams they belong to, by team name. */
  async me(userId: string): Promise<MeView> {
    const user = await this.em.findOneOrFail(User, { id: userId });
    const memberships = await this.em.find(Membership, { user: userId }, { populate: ['team'], orderBy: { team: { name: 'asc' } } });
    return { user: toUserView(user), teams: memberships.map((m) => ({ id: m.team.id, name: m.team.name, role: m.role })) };
  }

  async updateProfile(userId: string, displayName: string): Promise<UserView> {
    const user = await this.em.findOneOrFail(User, { id: userId });
    user.displayName = displayName;
    await this.em.flush();
    return toUserView(user);
  }

  /** The person's own recent account events: sign-ins (also failed ones), password changes. */
  activity(userId: string): Promise<AuditEventView[]> {
    return this.audit.forActor(userId, 50);
  }
}
