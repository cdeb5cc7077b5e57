import type { PinGeometry } from '@fieldbound/shared';
import type { DemoMapSpec } from './demo-maps';
import type { DemoPersonKey } from './demo-people';

export interface DemoReply {
  author: DemoPersonKey;
  /** Hours after the pin was opened. */
  afterHours: number;
  body: string;
}

export interface DemoPin {
  map: DemoMapSpec['key'];
  author: DemoPersonKey;
  /** Days before the seed ran. */
  daysAgo: number;
  title: string;
  body: string;
  category: string | null;
  /** Geometry in physical units (α in a₀³, B in tesla); `alphaOf` places a point at a catalogue atom. */
  geometry: PinGeometry | { kind: 'point'; alphaOf: string; fieldTesla: number };
  replies: DemoReply[];
  resolvedBy?: DemoPersonKey;
}

// The discussions are invented. They are written to show how a group would use pins: a question,
// a disputed region, a resolved candidate and a caveat.
export const DEMO_PINS: DemoPin[] = [
  {
    map: 'lab',
    author: 'owner',
    daysAgo: 9,
    title: 'Mg at 20 T: our lead candidate?',
    body: 'Magnesium has no stable field-free anion, and at 20 T the m = 1 state sits above the 1 mK floor. Before we plan beam time: how far above our energy resolution is it, and does it survive ion motion?',
    category: 'question',
    geometry: { kind: 'point', alphaOf: 'Mg', fieldTesla: 20 },
    replies: [
      { author: 'editorA', afterHours: 5, body: 'The probe gives the m = 1, level 0 binding in the tens of µeV at 20 T with r_c = 2 a₀, and ε/B is far below 0.1, so the single-orbital reduction is fine there. I am checking the 4 K map for survival.' },
      { author: 'editorB', afterHours: 20, body: 'The m = 1 value barely moves between the r_c = 1 and r_c = 4 maps, unlike m = 0. That makes it the number to quote.' },
      { author: 'viewer', afterHours: 30, body: 'Why does m = 0 depend so much more on the cutoff than m = 1?' },
      { author: 'owner', afterHours: 33, body: 'Because the m = 0 ring overlaps the atom: its potential near z = 0 goes like 1/(z² + r_c²), so the core decides. Orbitals with m ≥ 1 keep the electron away from the atom. See the physics notes on cutoff-dominated results.' },
    ],
  },
  {
    map: 'lab',
    author: 'editorB',
    daysAgo: 6,
    title: 'Disputed: Hg and Xe below 5 T',
    body: 'The map calls this region bound for m = 1, but the binding is within a factor of two of the 1 mK floor. I would not call these detectable with our spectrometer.',
    category: 'disputed',
    geometry: { kind: 'rect', min: { alpha: 25, fieldTesla: 1 }, max: { alpha: 40, fieldTesla: 5 } },
    replies: [
      { author: 'editorA', afterHours: 3, body: 'Agreed that it is marginal, but the floor is a setting, not physics. With a 0.1 mK resolution these would count. Keep the region open until we know the resolution of the new setup.' },
      { author: 'editorB', afterHours: 26, body: 'Then let us raise the floor to 2 mK on this map and see what remains.' },
    ],
  },
  {
    map: 'lab',
    author: 'editorA',
    daysAgo: 12,
    title: 'Cd at the hybrid facility',
    body: 'Cadmium (no field-free anion) has a clearly bound m = 1 state across the 35–45 T band, about an order of magnitude above the floor.',
    category: 'candidate',
    geometry: { kind: 'point', alphaOf: 'Cd', fieldTesla: 40 },
    replies: [
      { author: 'owner', afterHours: 8, body: 'Checked against the cutoff maps: stable. Resolving — Cd goes on the proposal as the second candidate.' },
    ],
    resolvedBy: 'owner',
  },
  {
    map: 'lab4K',
    author: 'editorA',
    daysAgo: 4,
    title: 'What survives at 4 K?',
    body: 'With a thermal ensemble at 4 K the survivors count drops near the top of the field range: the motional field grows like B^(3/2). The lowest orbitals are the robust ones.',
    category: 'question',
    geometry: { kind: 'rect', min: { alpha: 30, fieldTesla: 10 }, max: { alpha: 120, fieldTesla: 45 } },
    replies: [
      { author: 'owner', afterHours: 12, body: 'Compare with the 77 K map before we decide whether the cryogenic trap is worth it.' },
    ],
  },
  {
    map: 'cutoffSmall',
    author: 'editorB',
    daysAgo: 2,
    title: 'Caveat: m = 0 is cutoff-dominated here',
    body: 'Above α/r_c² ≈ 1 the m = 0 binding depends on r_c more than on anything else. Quote m = 0 numbers only with the band from r_c/2 to 2 r_c.',
    category: 'caveat',
    geometry: { kind: 'rect', min: { alpha: 1, fieldTesla: 1 }, max: { alpha: 1000, fieldTesla: 45 } },
    replies: [],
  },
];
