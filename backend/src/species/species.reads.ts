import { Injectable } from '@nestjs/common';
import { EntityManager } from '@mikro-orm/postgresql';
import type { SpeciesEntry } from '@fieldbound/shared';
import { selectRows } from '../common/sql-reads';
import type { CatalogueSpecies } from './catalogue-species.entity';
import type { TeamSpeciesInit } from './team-species.entity';
import { catalogueEntry, teamEntry } from './species.views';

// Columns aliased to the entities' property names, so the rows go through the same view functions as the ORM's entities.
const CATALOGUE_COLUMNS = `
  c.symbol, c.atomic_number as "atomicNumber", c.name, c.polarizability_a0 as "polarizabilityA0",
  c.polarizability_uncertainty_a0 as "polarizabilityUncertaintyA0", c.polarizability_source as "polarizabilitySource",
  c.polarizability_status as "polarizabilityStatus", c.electron_affinity_ev as "electronAffinityEv",
  c.electron_affinity_uncertainty_ev as "electronAffinityUncertaintyEv", c.electron_affinity_source as "electronAffinitySource",
  c.electron_affinity_status as "electronAffinityStatus", c.electron_affinity_note as "electronAffinityNote",
  c.mass_number as "massNumber", c.mass_source as "massSource"`;

const TEAM_COLUMNS = `
  s.id, s.line, s.name, s.polarizability_a0 as "polarizabilityA0", s.polarizability_uncertainty_a0 as "polarizabilityUncertaintyA0",
  s.entered_value as "enteredValue", s.entered_uncertainty as "enteredUncertainty", s.entered_unit as "enteredUnit",
  s.mass_number as "massNumber", s.electron_affinity_ev as "electronAffinityEv", s.source,
  l.id as "listId", l.name as "listName"`;

/** A team species row as the entity's fields, with its id and its list. */
interface TeamSpeciesRow extends TeamSpeciesInit {
  id: string;
  listId: string;
  listName: string;
}

/** Read-only species queries for the public viewing-link route (see common/sql-reads.ts for why plain SQL). */
@Injectable()
export class SpeciesReads {
  constructor(private readonly em: EntityManager) {}

  /**
   * The entries of the catalogue and of one team's lists that `names` pick out, matched as the map overlay matches
   * them: a catalogue atom by its name or its symbol, a team species by its name, exact text. In the order of
   * `SpeciesService.forTeam` (catalogue by atomic number, then lists by name, rows in file order); names that match
   * nothing give nothing.
   */
  async namedForTeam(teamId: string, names: readonly string[]): Promise<SpeciesEntry[]> {
    const wanted = [...new Set(names)];
    if (!wanted.length) return [];
    // An array parameter expands to a list of quoted literals, so `in (?)` takes it whole.
    const catalogue = await selectRows<CatalogueSpecies>(
      this.em,
      `select ${CATALOGUE_COLUMNS} from catalogue_species c where c.name in (?) or c.symbol in (?) order by c.atomic_number asc`,
      [wanted, wanted],
    );
    const own = await selectRows<TeamSpeciesRow>(
      this.em,
      `select ${TEAM_COLUMNS} from team_species s join species_lists l on l.id = s.list_id
       where l.team_id = ? and s.name in (?)
       order by l.name asc, s.line asc, s.id asc`,
      [teamId, wanted],
    );
    return [...catalogue.map(catalogueEntry), ...own.map((row) => teamEntry(row, { id: row.listId, name: row.listName }))];
  }
}
