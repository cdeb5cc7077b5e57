import { MikroORM } from '@mikro-orm/postgresql';
import type { AppConfig } from '../config/configuration';
import { ormOptions } from './mikro-orm.config';

/** Applies every pending committed migration; returns the names applied. */
export async function migrateUp(db: AppConfig['database']): Promise<string[]> {
  const orm = await MikroORM.init(ormOptions(db));
  try {
    const applied = await orm.getMigrator().up();
    return applied.map((m) => m.name);
  } finally {
    await orm.close(true);
  }
}

/** Drops everything in the public schema, then applies all migrations: a fresh schema for tests. */
export async function resetSchema(db: AppConfig['database']): Promise<string[]> {
  const orm = await MikroORM.init(ormOptions(db));
  try {
    await orm.em.getConnection().execute('drop schema if exists public cascade; create schema public;');
  } finally {
    await orm.close(true);
  }
  return migrateUp(db);
}
