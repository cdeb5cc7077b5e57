import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MikroORM } from '@mikro-orm/postgresql';
import { loadConfig } from '../config/configuration';
import { ormOptions } from './mikro-orm.config';

// The test database was built by applying every committed migration (test/global-setup.ts).
describe('hand-written migrations', () => {
  let orm: MikroORM;
  beforeAll(async () => {
    orm = await MikroORM.init(ormOptions(loadConfig().database));
  });
  afterAll(async () => {
    await orm.close(true);
  });

  it('produce exactly the schema the entities describe (the schema diff is empty)', async () => {
    const diff = await orm.getSchemaGenerator().getUpdateSchemaSQL({ wrap: false, safe: false, dropTables: true });
    expect(diff.trim()).toBe('');
  });

  it('can be rolled back to nothing and applied again, ending with the same schema', async () => {
    const migrator = orm.getMigrator();
    const applied = (await migrator.getExecutedMigrations()).map((m) => m.name);
    await migrator.down({ to: 0 });
    const tables = await orm.em.getConnection().execute<{ tablename: string }[]>(
      "select tablename from pg_tables where schemaname = 'public' and tablename <> 'mikro_orm_migrations'",
    );
    expect(tables.map((t) => t.tablename)).toEqual([]);
    await migrator.up();
    expect((await migrator.getExecutedMigrations()).map((m) => m.name)).toEqual(applied);
    const diff = await orm.getSchemaGenerator().getUpdateSchemaSQL({ wrap: false, safe: false, dropTables: true });
    expect(diff.trim()).toBe('');
  });
});
