import crypto from 'node:crypto';
import { MikroORM } from '@mikro-orm/postgresql';
import type { AppConfig } from '../src/config/configuration';
import { ormOptions } from '../src/database/mikro-orm.config';

/**
 * Generic helpers over every table of a database's public schema, for the backup test: fill each
 * table with rows whatever its columns are, and fingerprint each table's contents. Tables added by
 * later migrations are covered without touching this file, unless they use a column type
 * `fillValue` does not know yet (the error names the column).
 */

type Db = AppConfig['database'];
type Row = Record<string, string | null>;

export async function withOrm<T>(db: Db, work: (execute: (sql: string, params?: unknown[]) => Promise<any[]>) => Promise<T>): Promise<T> {
  const orm = await MikroORM.init({ ...ormOptions(db), pool: { min: 0, max: 2 } });
  try {
    return await work((sql, params = []) => orm.em.getConnection().execute(sql, params as any[]));
  } finally {
    await orm.close(true);
  }
}

const ident = (name: string) => `"${name.replace(/"/g, '""')}"`;

interface Column {
  table: string;
  name: string;
  type: string;
  udt: string;
  category: string;
  elem: string | null;
  nullable: boolean;
  has_default: boolean;
  generated: boolean;
  identity: boolean;
  max_length: number | null;
  enum_labels: string[] | null;
}

interface ForeignKey {
  name: string;
  table: string;
  ref: string;
  columns: string[];
  refColumns: string[];
}

async function describeSchema(execute: (sql: string, params?: unknown[]) => Promise<any[]>) {
  const columns = (await execute(`
    select c.relname as "table", a.attname as name, format_type(a.atttypid, a.atttypmod) as type, t.typname as udt, t.typcategory as category,
           te.typname as elem, not a.attnotnull as nullable, a.atthasdef as has_default, a.attgenerated <> '' as generated,
           a.attidentity <> '' as identity,
           case when t.typname in ('varchar', 'bpchar') and a.atttypmod > 4 then a.atttypmod - 4 end as max_length,
           (select array_agg(e.enumlabel order by e.enumsortorder) from pg_enum e where e.enumtypid = t.oid) as enum_labels
    from pg_attribute a
    join pg_class c on c.oid = a.attrelid
    join pg_type t on t.oid = a.atttypid
    left join pg_type te on te.oid = t.typelem and t.typcategory = 'A'
    where c.relnamespace = 'public'::regnamespace and c.relkind in ('r', 'p') and a.attnum > 0 and not a.attisdropped
    order by c.relname, a.attnum`)) as Column[];
  const fkRows = (await execute(`
    select con.conname as name, c.relname as "table", rc.relname as ref, a.attname as "column", ra.attname as ref_column, k.ord
    from pg_constraint con
    join pg_class c on c.oid = con.conrelid
    join pg_class rc on rc.oid = con.confrelid
    cross join lateral unnest(con.conkey, con.confkey) with ordinality as k(col, refcol, ord)
    join pg_attribute a on a.attrelid = con.conrelid and a.attnum = k.col
    join pg_attribute ra on ra.attrelid = con.confrelid and ra.attnum = k.refcol
    where con.contype = 'f' and con.connamespace = 'public'::regnamespace
    order by con.conname, k.ord`)) as { name: string; table: string; ref: string; column: string; ref_column: string }[];
  const fks = new Map<string, ForeignKey>();
  for (const r of fkRows) {
    const fk = fks.get(r.name) ?? { name: r.name, table: r.table, ref: r.ref, columns: [], refColumns: [] };
    fk.columns.push(r.column);
    fk.refColumns.push(r.ref_column);
    fks.set(r.name, fk);
  }
  const checks = (await execute(`
    select c.relname as "table", a.attname as "column", pg_get_constraintdef(con.oid) as def
    from pg_constraint con
    join pg_class c on c.oid = con.conrelid
    join pg_attribute a on a.attrelid = con.conrelid and a.attnum = con.conkey[1]
    where con.contype = 'c' and c.relnamespace = 'public'::regnamespace and array_length(con.conkey, 1) = 1`)) as { table: string; column: string; def: string }[];
  /** Single-column checks of the form col = ANY (ARRAY['a', 'b']) / col IN ('a', 'b'): the allowed literals. */
  const allowed = new Map<string, string[]>();
  for (const c of checks) {
    if (!/= ANY|IN \(/.test(c.def)) continue;
    const literals = [...c.def.matchAll(/'((?:[^']|'')*)'/g)].map((m) => m[1].replace(/''/g, "'"));
    if (literals.length) allowed.set(`${c.table}.${c.column}`, literals);
  }
  const tables = [...new Set(columns.map((c) => c.table))].sort();
  return { tables, columns, fks: [...fks.values()], allowed };
}

const TRICKY = ' <script>alert("x")</script> & \'single\' "double" \\ back\nline\ttab ünïcödé → 😀';

function text(row: number, variant: number, max: number | null): string {
  const s = `r${row}v${variant}${TRICKY}`;
  return max === null ? s : Array.from(s).slice(0, max).join('');
}

/** A value for one column of row `row` as text PostgreSQL casts to the column type; undefined = use the default. */
function fillValue(c: Column, row: number, variant: number, allowed: string[] | undefined): string | null | undefined {
  if (allowed) return allowed[(row + variant) % allowed.length];
  if (c.enum_labels?.length) return c.enum_labels[(row + variant) % c.enum_labels.length];
  const n = row + 1 + 100 * variant;
  switch (c.udt) {
    case 'uuid':
      return crypto.randomUUID();
    case 'int2':
    case 'int4':
    case 'int8':
      return String(n);
    case 'numeric':
      return `${n}.125`;
    case 'float4':
      return `${n}.5`;
    case 'float8':
      return String(n * 1.2345678901234567);
    case 'bool':
      return row % 2 === 0 ? 'true' : 'false';
    case 'text':
    case 'varchar':
    case 'bpchar':
    case 'citext':
    case 'name':
      return text(row, variant, c.max_length);
    case 'timestamptz':
      return `2026-12-${String(2 + row).padStart(2, '0')} 01:02:03.456789+00`;
    case 'timestamp':
      return `2026-12-${String(2 + row).padStart(2, '0')} 01:02:03.456789`;
    case 'date':
      return `2026-12-${String(2 + row).padStart(2, '0')}`;
    case 'time':
      return '01:02:03.5';
    case 'interval':
      return `${n} days 02:03:04`;
    case 'json':
    case 'jsonb':
      return JSON.stringify({ row, variant, html: '<b>bold</b>', unicode: 'ü😀', nested: { list: [1, 2.5, null, true, 'x'], empty: {} } });
    case 'bytea':
      return `\\x${Buffer.from([0, 1, 2, 127, 128, 255, row, 0]).toString('hex')}`;
    case 'inet':
      return `127.0.0.${row + 1}`;
    case 'cidr':
      return `10.${row}.0.0/16`;
  }
  if (c.category === 'A') {
    if (['text', 'varchar', 'citext'].includes(c.elem ?? '')) return `{"r${row}","comma, inside","quote \\" inside",""}`;
    if (['int2', 'int4', 'int8', 'float8', 'numeric'].includes(c.elem ?? '')) return `{${n},2,3}`;
    return '{}';
  }
  if (c.has_default) return undefined;
  if (c.nullable) return null;
  throw new Error(`the backup test cannot fill ${c.table}.${c.name} of type ${c.type}: teach fillValue() in test/database-contents.ts this type`);
}

/**
 * Inserts `rowsPerTable` rows into every empty table of the public schema (tables a migration
 * already filled keep their rows), parents before children, foreign keys pointing at real rows,
 * values of every kind (NULLs, defaults, unicode, HTML, quotes, bytes with zeros, JSON, arrays).
 * Returns the number of rows inserted per table.
 */
export async function fillEveryTable(db: Db, rowsPerTable = 3): Promise<Record<string, number>> {
  return withOrm(db, async (execute) => {
    const { tables, columns, fks, allowed } = await describeSchema(execute);
    const rows = new Map<string, Row[]>();
    const inserted: Record<string, number> = {};
    // Already filled (e.g. the species catalogue seeded by its migration): keep, but remember rows for references.
    const pending = new Set<string>();
    for (const table of tables) {
      const existing = (await execute(`select * from ${ident(table)} limit ${rowsPerTable}`)) as Record<string, unknown>[];
      if (existing.length) rows.set(table, existing.map((r) => Object.fromEntries(Object.entries(r).map(([k, v]) => [k, v === null ? null : v instanceof Date ? v.toISOString() : String(v)]))));
      else pending.add(table);
    }
    while (pending.size) {
      // Parents first; in a cycle, a table whose unfilled references are all nullable.
      const ready =
        [...pending].find((t) => fks.filter((f) => f.table === t && f.ref !== t).every((f) => rows.has(f.ref))) ??
        [...pending].find((t) => fks.filter((f) => f.table === t && f.ref !== t && !rows.has(f.ref)).every((f) => f.columns.every((col) => columns.find((c) => c.table === t && c.name === col)?.nullable)));
      if (!ready) throw new Error(`cannot order the inserts of ${[...pending].join(', ')} (a cycle of required foreign keys)`);
      pending.delete(ready);
      const tableColumns = columns.filter((c) => c.table === ready && !c.generated && !c.identity);
      const tableFks = fks.filter((f) => f.table === ready);
      const done: Row[] = [];
      for (let row = 0; row < rowsPerTable; row++) {
        let lastError: unknown;
        // Variants: row 0 leaves nullable columns NULL; later variants fill them, or shift values past unique clashes.
        for (const [variant, nulls] of [[0, row === 0], [0, false], [1, false], [2, true], [3, false]] as const) {
          const values = new Map<string, string | null>();
          for (const fk of tableFks) {
            const parents = fk.ref === ready ? done : rows.get(fk.ref) ?? [];
            const nullable = fk.columns.every((col) => tableColumns.find((c) => c.name === col)?.nullable);
            const parent = parents.length ? parents[(row + variant) % parents.length] : null;
            if (!parent || (nulls && nullable)) {
              if (!nullable) throw new Error(`${ready}.${fk.columns.join(',')}: no parent row in ${fk.ref}`);
              fk.columns.forEach((col) => values.set(col, null));
            } else fk.columns.forEach((col, k) => values.set(col, parent[fk.refColumns[k]]));
          }
          for (const c of tableColumns) {
            if (values.has(c.name)) continue;
            if (nulls && c.nullable) values.set(c.name, null);
            else if (row === 1 && variant === 0 && c.has_default) continue; // exercise defaults on one row
            else {
              const v = fillValue(c, row, variant, allowed.get(`${ready}.${c.name}`));
              if (v !== undefined) values.set(c.name, v);
            }
          }
          const names = [...values.keys()];
          const types = names.map((name) => tableColumns.find((c) => c.name === name)!.type);
          const sql = names.length
            ? `insert into ${ident(ready)} (${names.map(ident).join(', ')}) values (${types.map((t) => `cast(? as ${t})`).join(', ')}) returning *`
            : `insert into ${ident(ready)} default values returning *`;
          try {
            const [created] = (await execute(sql, [...values.values()])) as Record<string, unknown>[];
            const asText: Row = {};
            for (const [k, v] of Object.entries(created)) asText[k] = v === null ? null : v instanceof Date ? v.toISOString() : Buffer.isBuffer(v) ? `\\x${v.toString('hex')}` : typeof v === 'object' ? JSON.stringify(v) : String(v);
            done.push(asText);
            lastError = undefined;
            break;
          } catch (error) {
            lastError = error;
          }
        }
        if (lastError) throw new Error(`could not insert row ${row} into ${ready}: ${(lastError as Error).message}`);
      }
      rows.set(ready, done);
      inserted[ready] = done.length;
    }
    return inserted;
  });
}

export interface TableFingerprint {
  rows: number;
  md5: string;
}

export interface DatabaseFingerprint {
  tables: Record<string, TableFingerprint>;
  columns: string[];
  constraints: string[];
  indexes: string[];
  sequences: string[];
}

/** Row count and md5 of the sorted text of every row, per table; plus the schema (columns, constraints, indexes, sequences). */
export async function fingerprint(db: Db): Promise<DatabaseFingerprint> {
  return withOrm(db, async (execute) => {
    const tableNames = ((await execute(`select tablename from pg_tables where schemaname = 'public' order by tablename`)) as { tablename: string }[]).map((r) => r.tablename);
    const tables: Record<string, TableFingerprint> = {};
    for (const table of tableNames) {
      const [r] = (await execute(`select count(*)::int as rows, md5(coalesce(string_agg(t::text, E'\\n' order by t::text), '')) as md5 from ${ident(table)} t`)) as { rows: number; md5: string }[];
      tables[table] = r;
    }
    const lines = async (sql: string) => ((await execute(sql)) as { line: string }[]).map((r) => r.line);
    return {
      tables,
      columns: await lines(`select concat_ws(' ', table_name, column_name, data_type, is_nullable, column_default) as line from information_schema.columns where table_schema = 'public' order by table_name, ordinal_position`),
      constraints: await lines(`select concat_ws(' ', conrelid::regclass::text, conname, pg_get_constraintdef(oid)) as line from pg_constraint where connamespace = 'public'::regnamespace order by 1`),
      indexes: await lines(`select indexdef as line from pg_indexes where schemaname = 'public' order by indexname`),
      sequences: await lines(`select concat_ws(' ', sequencename, last_value) as line from pg_sequences where schemaname = 'public' order by sequencename`),
    };
  });
}
