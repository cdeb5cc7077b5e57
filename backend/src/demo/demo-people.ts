/**
 * The invented demo research group. Everything here is fiction made for the demo: the people, the
 * group, the e-mail domain (a reserved `.test` name that never delivers) and the discussions.
 * The passwords are public on purpose — demo only; never reuse them.
 */
export const DEMO_TEAM_NAME = 'Solberg group · field-bound anions (demo)';

export const DEMO_PEOPLE = {
  owner: { email: 'maren.solberg@demo.fieldbound.test', displayName: 'Maren Solberg', password: 'demo-owner-2026', role: 'owner' },
  editorA: { email: 'kofi.mensah@demo.fieldbound.test', displayName: 'Kofi Mensah', password: 'demo-editor-2026', role: 'editor' },
  editorB: { email: 'ilse.varga@demo.fieldbound.test', displayName: 'Ilse Varga', password: 'demo-editor-2026', role: 'editor' },
  viewer: { email: 'tariq.bello@demo.fieldbound.test', displayName: 'Tariq Bello', password: 'demo-viewer-2026', role: 'viewer' },
} as const;

export type DemoPersonKey = keyof typeof DEMO_PEOPLE;

/**
 * The lecture's viewing link. A fixed token so the user guide can name the address; it is stored
 * hashed like every other token, and it is demo data only.
 */
export const DEMO_LECTURE_TOKEN = 'demo-lecture-link-Solberg-group-anions-2026';
