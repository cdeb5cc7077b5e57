import { defaultSetup, type MapSetup } from '@fieldbound/shared';

/**
 * The laboratory shortlist (catalogue symbols): mostly atoms with no stable field-free anion, where a
 * field-induced state would be the only bound anion, plus Ca and Sr (weakly bound field-free anions) for contrast.
 */
export const LAB_SHORTLIST = ['Mg', 'Cd', 'Zn', 'Be', 'Hg', 'Xe', 'Kr', 'Ar', 'Ca', 'Sr'];

const LAB_BANDS: MapSetup['fieldBands'] = [
  { label: 'Group magnet (up to 20 T)', minTesla: 1, maxTesla: 20 },
  { label: 'Hybrid facility (35–45 T)', minTesla: 35, maxTesla: 45 },
];

function laboratory(overrides: Partial<MapSetup> = {}): MapSetup {
  const base = defaultSetup();
  return {
    ...base,
    grid: { nAlpha: 192, nField: 160 },
    orbitals: { mMax: 5 },
    energyFloorKelvin: 1e-3,
    ion: { massNumber: 24 },
    contours: { levelsKelvin: [1e-3, 1e-2, 0.1, 1] },
    display: { ...base.display, energyUnit: 'ueV', shown: { kind: 'orbital', m: 0 } },
    species: LAB_SHORTLIST,
    fieldBands: LAB_BANDS,
    ...overrides,
  };
}

export interface DemoMapSpec {
  key: 'lab' | 'lab4K' | 'lab77K' | 'whiteDwarf' | 'cutoffSmall' | 'cutoffLarge';
  author: 'owner' | 'editorA' | 'editorB';
  title: string;
  description: string;
  tags: string[];
  setup: MapSetup;
}

export const DEMO_MAPS: DemoMapSpec[] = [
  {
    key: 'lab',
    author: 'owner',
    title: 'Laboratory scan: shortlist at 1–45 T',
    description: 'Fixed atoms, no ion motion. Which of the shortlisted species have field-induced states bound by more than 1 mK in fields our magnets reach? The m = 0 orbital binds by tens of µeV at 20 T; m ≥ 1 stays near or below the floor up to 45 T.',
    tags: ['laboratory', 'shortlist'],
    setup: laboratory(),
  },
  {
    key: 'lab4K',
    author: 'editorA',
    title: 'Laboratory scan with ion motion at 4 K',
    description: 'The laboratory scan with a thermal ion ensemble at 4 K (mass number 24, as for ²⁴Mg⁻), observed for 1 s. Shows how many states survive the motional electric field; the band ends at our magnet’s 20 T.',
    tags: ['laboratory', 'ion motion', '4 K'],
    setup: laboratory({ motion: { kind: 'temperature', kelvin: 4 }, display: { ...laboratory().display, shown: { kind: 'survivors' } } }),
  },
  {
    key: 'lab77K',
    author: 'editorA',
    title: 'Laboratory scan with ion motion at 77 K',
    description: 'Same as the 4 K map with a liquid-nitrogen-temperature ensemble (77 K): the faster ions see a stronger motional field, and states that were bound at 4 K turn into resonances.',
    tags: ['laboratory', 'ion motion', '77 K'],
    setup: laboratory({ motion: { kind: 'temperature', kelvin: 77 }, display: { ...laboratory().display, shown: { kind: 'survivors' } } }),
  },
  {
    key: 'whiteDwarf',
    author: 'editorB',
    title: 'Magnetised white dwarfs: 10²–10⁵ T',
    description: 'Strong-field scan for magnetised white-dwarf atmospheres. Binding grows like α²B³ for m ≥ 1, so these fields bind even weakly polarizable atoms by meV.',
    tags: ['astrophysics', 'strong field'],
    setup: {
      ...laboratory(),
      fieldAxis: { min: 100, max: 1e5, scale: 'log' },
      orbitals: { mMax: 7 },
      species: ['H', 'He', 'C', 'N', 'O', 'Ne', 'Na', 'Mg', 'Ar', 'Ca'],
      fieldBands: [],
      display: { ...laboratory().display, energyUnit: 'meV', shown: { kind: 'orbital', m: 0 } },
      contours: { levelsKelvin: [1, 10, 100] },
    },
  },
  {
    key: 'cutoffSmall',
    author: 'editorB',
    title: 'Cutoff sensitivity: r_c = 1 a₀',
    description: 'The laboratory scan with the short-range cutoff halved. Compare with the r_c = 2 a₀ scan and the r_c = 4 a₀ map: m = 0 moves a lot, m ≥ 1 hardly at all.',
    tags: ['cutoff', 'sensitivity'],
    setup: laboratory({ shortRange: { model: 'regularized-polarization', cutoffBohr: 1 }, display: { ...laboratory().display, shown: { kind: 'orbital', m: 0 } } }),
  },
  {
    key: 'cutoffLarge',
    author: 'editorB',
    title: 'Cutoff sensitivity: r_c = 4 a₀',
    description: 'The laboratory scan with the short-range cutoff doubled.',
    tags: ['cutoff', 'sensitivity'],
    setup: laboratory({ shortRange: { model: 'regularized-polarization', cutoffBohr: 4 }, display: { ...laboratory().display, shown: { kind: 'orbital', m: 0 } } }),
  },
];
