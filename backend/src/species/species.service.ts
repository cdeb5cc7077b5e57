import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { EntityManager, raw, UniqueConstraintViolationException } from '@mikro-orm/postgresql';
import type { CsvRejectedBody, SpeciesEntry, SpeciesListDetail, SpeciesListResponse, SpeciesListView } from '@fieldbound/shared';
import { Clock } from '../common/clock';
import type { UploadedBytes } from '../common/uploaded-file';
import type { AuthUser } from '../common/current-user.decorator';
import type { Team } from '../teams/team.entity';
import { User } from '../users/user.entity';
import { CatalogueSpecies } from './catalogue-species.entity';
import { parseSpeciesCsv } from './species-csv';
import { SpeciesList } from './species-list.entity';
import { TeamSpecies } from './team-species.entity';
import { catalogueEntry, listView, teamEntry } from './species.views';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

function matches(entry: SpeciesEntry, search: string | undefined): boolean {
  if (!search) return true;
  const s = search.toLowerCase();
  return entry.name.toLowerCase().includes(s) || (entry.symbol?.toLowerCase() === s);
}

function listNotFound(): NotFoundException {
  return new NotFoundException({ statusCode: 404, code: 'species_list_not_found', message: 'This team has no such species list.' });
}

/** The built-in catalogue and the teams' own species lists, served in one shape. */
@Injectable()
export class SpeciesService {
  constructor(
    private readonly em: EntityManager,
    private readonly clock: Clock,
  ) {}

  async catalogue(search?: string): Promise<SpeciesListResponse> {
    const rows = await this.em.find(CatalogueSpecies, {}, { orderBy: { atomicNumber: 'asc' } });
    return { items: rows.map(catalogueEntry).filter((e) => matches(e, search)) };
  }

  /** The catalogue followed by every species of the team's lists (lists by name, rows in file order). */
  async forTeam(teamId: string, search?: string): Promise<SpeciesListResponse> {
    const catalogue = (await this.catalogue(search)).items;
    const lists = await this.em.find(SpeciesList, { team: teamId }, { populate: ['species'], orderBy: { name: 'asc' } });
    const own = lists.flatMap((list) => list.species.getItems().map((s) => teamEntry(s, list)));
    return { items: [...catalogue, ...own.filter((e) => matches(e, search))] };
  }

  async lists(teamId: string): Promise<SpeciesListView[]> {
    const lists = await this.em.find(SpeciesList, { team: teamId }, { populate: ['createdBy'], orderBy: { name: 'asc' } });
    const counts = new Map<string, number>();
    if (lists.length) {
      const rows = await this.em
        .createQueryBuilder(TeamSpecies, 's')
        .select(['s.list_id', raw('count(*)::int as n')])
        .where({ list: { $in: lists.map((l) => l.id) } })
        .groupBy('s.list_id')
        .execute<{ listId?: string; list_id?: string; n: number }[]>('all', false);
      for (const r of rows) counts.set((r.list_id ?? r.listId)!, Number(r.n));
    }
    return lists.map((l) => listView(l, counts.get(l.id) ?? 0));
  }

  async list(teamId: string, listId: string): Promise<SpeciesListDetail> {
    const list = await this.findList(teamId, listId);
    const species = list.species.getItems();
    return { ...listView(list, species.length), species: species.map((s) => teamEntry(s, list)) };
  }

  /**
   * Imports a CSV as a new list: all rows in one transaction, or nothing, with every problem
   * (line, column, message) in a 400.
   */
  async upload(team: Team, caller: AuthUser, name: string, file: UploadedBytes | undefined): Promise<SpeciesListDetail> {
    if (!file) throw rejected([{ line: null, column: null, message: 'Attach the CSV file in the "file" field.' }]);
    const parsed = parseSpeciesCsv(file.buffer);
    if (!parsed.ok) throw rejected(parsed.issues);
    if (await this.em.count(SpeciesList, { team, name })) throw duplicateListName(name);
    const author = await this.em.findOneOrFail(User, caller.id);
    const list = new SpeciesList(team, name, author, this.clock.now());
    list.fileName = file.originalname ? file.originalname.slice(0, 255) : null;
    this.em.persist(list);
    for (const row of parsed.rows) list.species.add(new TeamSpecies(list, row));
    try {
      await this.em.flush();
    } catch (error) {
      if (error instanceof UniqueConstraintViolationException) throw duplicateListName(name);
      throw error;
    }
    return { ...listView(list, parsed.rows.length), species: list.species.getItems().map((s) => teamEntry(s, list)) };
  }

  async remove(teamId: string, listId: string): Promise<void> {
    const list = await this.findList(teamId, listId);
    await this.em.remove(list).flush();
  }

  private async findList(teamId: string, listId: string): Promise<SpeciesList> {
    if (!UUID.test(listId)) throw listNotFound();
    const list = await this.em.findOne(SpeciesList, { id: listId.toLowerCase(), team: teamId }, { populate: ['species', 'createdBy'] });
    if (!list) throw listNotFound();
    return list;
  }
}

function rejected(issues: CsvRejectedBody['issues']): BadRequestException {
  const body: CsvRejectedBody = {
    statusCode: 400,
    code: 'csv_rejected',
    message: `Nothing was imported: the file has ${issues.length} problem${issues.length === 1 ? '' : 's'}.`,
    issues,
  };
  return new BadRequestException(body);
}

function duplicateListName(name: string): ConflictException {
  return new ConflictException({ statusCode: 409, code: 'species_list_name_taken', message: `This team already has a species list named "${name}".` });
}
