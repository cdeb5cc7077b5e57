import type { AppConfig } from '../config/configuration';

/**
 * Seeds the demo scenario once into an empty database and reports what it did.
 * The demo research group and its maps arrive with the demo-data feature; until then there is nothing to seed.
 */
export async function seedDemoData(_db: AppConfig['database']): Promise<string> {
  return 'no demo data is defined yet; nothing seeded';
}
