import crypto from 'node:crypto';
import { Entity, Enum, ManyToOne, PrimaryKey, Property, Unique } from '@mikro-orm/core';
import type { AlphaUnit } from '@fieldbound/shared';
import { SpeciesList } from './species-list.entity';

export const ALPHA_UNITS = ['a0^3', 'A^3', '1e-24cm^3'] as const satisfies readonly AlphaUnit[];

export interface TeamSpeciesInit {
  line: number;
  name: string;
  polarizabilityA0: number;
  polarizabilityUncertaintyA0: number | null;
  enteredValue: number;
  enteredUncertainty: number | null;
  enteredUnit: AlphaUnit;
  massNumber: number;
  electronAffinityEv: number | null;
  source: string;
}

/**
 * One species of a team list. The polarizability is stored in a₀³ (converted with the shared CODATA 2018
 * factors); what was typed, and in which unit, is kept beside it.
 */
@Entity({ tableName: 'team_species' })
@Unique({ name: 'team_species_list_name_unique', expression: 'create unique index "team_species_list_name_unique" on "team_species" ("list_id", lower("name"))' })
export class TeamSpecies {
  @PrimaryKey({ type: 'uuid' })
  id: string = crypto.randomUUID();

  @ManyToOne(() => SpeciesList, { deleteRule: 'cascade' })
  list: SpeciesList;

  /** Line of the CSV it came from (keeps the file's order). */
  @Property({ type: 'integer' })
  line: number;

  @Property({ type: 'string', length: 80 })
  name: string;

  @Property({ type: 'double' })
  polarizabilityA0: number;

  @Property({ type: 'double', nullable: true })
  polarizabilityUncertaintyA0: number | null;

  @Property({ type: 'double' })
  enteredValue: number;

  @Property({ type: 'double', nullable: true })
  enteredUncertainty: number | null;

  @Enum({ items: () => [...ALPHA_UNITS], type: 'string' })
  enteredUnit: AlphaUnit;

  @Property({ type: 'integer' })
  massNumber: number;

  /** eV; null = no stable anion given. */
  @Property({ type: 'double', nullable: true })
  electronAffinityEv: number | null;

  @Property({ type: 'text' })
  source: string;

  constructor(list: SpeciesList, init: TeamSpeciesInit) {
    this.list = list;
    this.line = init.line;
    this.name = init.name;
    this.polarizabilityA0 = init.polarizabilityA0;
    this.polarizabilityUncertaintyA0 = init.polarizabilityUncertaintyA0;
    this.enteredValue = init.enteredValue;
    this.enteredUncertainty = init.enteredUncertainty;
    this.enteredUnit = init.enteredUnit;
    this.massNumber = init.massNumber;
    this.electronAffinityEv = init.electronAffinityEv;
    this.source = init.source;
  }
}
