import crypto from 'node:crypto';
import { Collection, Entity, OneToMany, type Opt, PrimaryKey, Property } from '@mikro-orm/core';
import { Membership } from './membership.entity';

/** A research group: its maps are private to its members. */
@Entity({ tableName: 'teams' })
export class Team {
  @PrimaryKey({ type: 'uuid' })
  id: string = crypto.randomUUID();

  @Property({ type: 'string', length: 100 })
  name: string;

  @Property({ type: 'datetime' })
  createdAt: Date & Opt = new Date();

  @OneToMany(() => Membership, (membership) => membership.team)
  memberships = new Collection<Membership>(this);

  constructor(name: string) {
    this.name = name.trim();
  }
}
