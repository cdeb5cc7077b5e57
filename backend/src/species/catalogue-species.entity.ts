import { Entity, PrimaryKey, Property } from '@mikro-orm/core';

/**
 * One neutral atom of the built-in catalogue. Rows are written only by the seeding migration
 * (from `data/builtin-species.ts`); the API reads them. Every number keeps its published source.
 */
@Entity({ tableName: 'catalogue_species', readonly: true })
export class CatalogueSpecies {
  @PrimaryKey({ type: 'string', length: 3 })
  symbol: string;

  @Property({ type: 'integer', unique: true })
  atomicNumber: number;

  @Property({ type: 'string', length: 40 })
  name: string;

  /** Static dipole polarizability, a₀³. */
  @Property({ type: 'double' })
  polarizabilityA0: number;

  @Property({ type: 'double', nullable: true })
  polarizabilityUncertaintyA0: number | null;

  @Property({ type: 'text' })
  polarizabilitySource: string;

  @Property({ type: 'string', length: 20 })
  polarizabilityStatus: string;

  /** eV; null = no stable anion. */
  @Property({ type: 'double', nullable: true })
  electronAffinityEv: number | null;

  @Property({ type: 'double', nullable: true })
  electronAffinityUncertaintyEv: number | null;

  @Property({ type: 'text' })
  electronAffinitySource: string;

  @Property({ type: 'string', length: 20 })
  electronAffinityStatus: string;

  @Property({ type: 'text', nullable: true })
  electronAffinityNote: string | null;

  @Property({ type: 'integer' })
  massNumber: number;

  @Property({ type: 'text' })
  massSource: string;
}
