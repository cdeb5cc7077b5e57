import crypto from 'node:crypto';
import { Collection, Entity, Index, ManyToOne, OneToMany, type Opt, PrimaryKey, Property, Unique } from '@mikro-orm/core';
import { Team } from '../teams/team.entity';
import { User } from '../users/user.entity';
import { TeamSpecies } from './team-species.entity';

/** A team's own species, imported whole from one CSV upload. */
@Entity({ tableName: 'species_lists' })
@Unique({ name: 'species_lists_team_name_unique', properties: ['team', 'name'] })
@Index({ name: 'species_lists_team_index', properties: ['team'] })
export class SpeciesList {
  @PrimaryKey({ type: 'uuid' })
  id: string = crypto.randomUUID();

  @ManyToOne(() => Team, { deleteRule: 'cascade' })
  team: Team;

  @Property({ type: 'string', length: 100 })
  name: string;

  /** Name of the uploaded file, as the browser sent it (display only). */
  @Property({ type: 'string', length: 255, nullable: true })
  fileName: string | null = null;

  @ManyToOne(() => User, { nullable: true, deleteRule: 'set null' })
  createdBy: User | null;

  @Property({ type: 'datetime' })
  createdAt: Date & Opt = new Date();

  @OneToMany(() => TeamSpecies, (species) => species.list, { orderBy: { line: 'asc' } })
  species = new Collection<TeamSpecies>(this);

  constructor(team: Team, name: string, createdBy: User | null, createdAt: Date) {
    this.team = team;
    this.name = name;
    this.createdBy = createdBy;
    this.createdAt = createdAt;
  }
}
