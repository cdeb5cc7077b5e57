import crypto from 'node:crypto';
import { Entity, Enum, Index, ManyToOne, type Opt, PrimaryKey, Property, Unique } from '@mikro-orm/core';
import { User } from '../users/user.entity';
import { Team } from './team.entity';
import { TEAM_ROLES, type TeamRole } from './team-role';

/** A person's place in a team, with one role. */
@Entity({ tableName: 'memberships' })
@Unique({ name: 'memberships_team_user_unique', properties: ['team', 'user'] })
@Index({ name: 'memberships_user_index', properties: ['user'] })
export class Membership {
  @PrimaryKey({ type: 'uuid' })
  id: string = crypto.randomUUID();

  @ManyToOne(() => Team, { deleteRule: 'cascade' })
  team: Team;

  @ManyToOne(() => User, { deleteRule: 'cascade' })
  user: User;

  @Enum({ items: () => [...TEAM_ROLES], type: 'string' })
  role: TeamRole;

  @Property({ type: 'datetime' })
  createdAt: Date & Opt = new Date();

  constructor(team: Team, user: User, role: TeamRole) {
    this.team = team;
    this.user = user;
    this.role = role;
  }
}
