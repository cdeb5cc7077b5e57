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
    body: 'Magnesium has no stable field-free anion, and at 20 T its m = 0 state sits far above the 1 mK floor. Before we plan beam time: how strongly is it bound, how much of that is the cutoff, and does it survive ion motion?',
    category: 'question',
    geometry: { kind: 'point', alphaOf: 'Mg', fieldTesla: 20 },
    replies: [
      { author: 'editorA', afterHours: 5, body: 'The probe at Mg, 20 T gives m = 0, level 0 at about 71 µeV (0.8 K) with r_c = 2 a₀, and ε/B far below 0.1, so the single-orbital reduction is fine there. m = 1 is only about 0.01 µeV (0.1 mK), under the floor. I am checking the 4 K map for survival.' },
      { author: 'editorB', afterHours: 20, body: 'Careful: m = 0 is the cutoff-sensitive orbital. The same point gives roughly 290 µeV on the r_c = 1 a₀ map and 17 µeV on the r_c = 4 a₀ map. Quote it as a band, not as one number.' },
      { author: 'viewer', afterHours: 30, body: 'Why does m = 0 depend so much more on the cutoff than m = 1?' },
      { author: 'owner', afterHours: 33, body: 'Because the m = 0 ring overlaps the atom: its potential near z = 0 goes like 1/(z² + r_c²), so the core decides. Orbitals with m ≥ 1 keep the electron away from the atom, which is also why they bind so much more weakly at laboratory fields. See the physics notes on cutoff-dominated results.' },
    ],
  },
  {
    map: 'lab',
    author: 'editorB',
    daysAgo: 6,
    title: 'Disputed: Hg and Xe below 5 T',
    body: 'The map calls this region bound (m = 0), but at 2 T the binding is only about 2 mK for Hg and 1.3 mK for Xe — within a factor of two of the 1 mK floor. I would not call these detectable with our spectrometer.',
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
    body: 'Cadmium (no field-free anion) has a clearly bound m = 0 state across the 35–45 T band: about 115 µeV at 40 T with r_c = 2 a₀, two orders of magnitude above the floor. Its m = 1 state stays under 1 mK even there.',
    category: 'candidate',
    geometry: { kind: 'point', alphaOf: 'Cd', fieldTesla: 40 },
    replies: [
      { author: 'owner', afterHours: 8, body: 'Checked against the cutoff maps: it stays bound from r_c = 1 a₀ to 4 a₀ (roughly 30–470 µeV at 40 T, so the number moves but the state does not go away). Resolving — Cd goes on the proposal as the second candidate.' },
    ],
    resolvedBy: 'owner',
  },
  {
    map: 'lab4K',
    author: 'editorA',
    daysAgo: 4,
    title: 'What survives at 4 K?',
    body: 'With a thermal ensemble at 4 K every m ≥ 1 state is destroyed by the motional field; only m = 0 survives. At 20 T Mg and Cd stay bound, but in this box Zn, Be, Hg and Xe turn into resonances, and Kr and Ar are gone. Lower fields are worse, not better: at 10 T even Mg is only a resonance, because the binding falls faster than the motional field.',
    category: 'question',
    // Over the species that do not stay bound (Ar … Zn), leaving Cd and Mg free to probe.
    geometry: { kind: 'rect', min: { alpha: 10, fieldTesla: 10 }, max: { alpha: 40, fieldTesla: 45 } },
    replies: [
      { author: 'editorB', afterHours: 6, body: 'The map uses mass number 24 for every marker. Cd is heavier (114): with its own mass it moves more slowly at 4 K, and nearly the whole ensemble stays bound at 20 T. Change the mass number in the setup to check a species.' },
      { author: 'owner', afterHours: 12, body: 'Compare with the 77 K map before we decide whether the cryogenic trap is worth it.' },
      { author: 'editorA', afterHours: 28, body: 'At 77 K even Mg is a resonance at 20 T, with a lifetime of the order of 10 ns. The trap is worth it.' },
    ],
  },
  {
    map: 'cutoffSmall',
    author: 'editorB',
    daysAgo: 2,
    title: 'Caveat: m = 0 is cutoff-dominated here',
    body: 'Above α/r_c² ≈ 1 the m = 0 binding depends on r_c more than on anything else. Quote m = 0 numbers only with the band from r_c/2 to 2 r_c.',
    category: 'caveat',
    // A point in a quiet corner: a box over the whole map would cover every point the guide probes.
    geometry: { kind: 'point', at: { alpha: 400, fieldTesla: 3 } },
    replies: [],
  },
];
