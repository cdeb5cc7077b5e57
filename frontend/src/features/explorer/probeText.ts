import type { LevelState, MapSetup, MotionStateResult } from '@fieldbound/shared';
import { ALPHA_UNIT_LABEL, ENERGY_UNIT_LABEL, FIELD_UNIT_LABEL, alphaToDisplay, energyToDisplay, fieldTeslaToDisplay } from '../map-render/displayUnits';
import { formatScientific } from '../map-render/formatNumber';
import type { ProbePoint } from './viewState';

/** Plain words for the engine's validity flags (fixed atom, from `levels`; moving ion, from `motionStates`). */
export const FLAG_TEXT: Record<string, { label: string; meaning: string }> = {
  'cutoff-dominated': { label: 'cutoff-dominated', meaning: 'm = 0 with α/r_c² ≳ 1: the value depends on the cutoff radius.' },
  'non-adiabatic': { label: 'non-adiabatic', meaning: 'ε/B > 0.1: binding not small against the Landau spacing; the single-orbital approximation is doubtful.' },
  'field-free-anion': { label: 'field-free anion', meaning: 'This atom has a field-free negative ion, which the model does not describe (m = 0 channel).' },
  'below-floor': { label: 'below floor', meaning: 'Bound more weakly than the energy floor: counted as not bound on the map.' },
  unresolved: { label: 'unresolved', meaning: 'Counted, but bound more weakly than the solver’s smallest searched energy.' },
  'motion:non-adiabatic': { label: 'slow-field limit doubtful', meaning: 'ε < 2(m + 1)Ω: the motional field is not quasi-static for this state; it survives only in the lowest ion Landau levels.' },
  'motion:outside-width-table': { label: 'table edge', meaning: 'Orbital or shape number outside the width table: the width is taken at the table edge.' },
  'motion:channel-closed': { label: 'channel closed', meaning: 'The ion’s recoil closes the decay channel: the width is exactly zero.' },
  'motion:destroyed': { label: 'destroyed', meaning: 'The motional electric field is too strong for this state to exist.' },
};

/** The adiabatic reduction is trusted while ε/B stays below this (the engine's non-adiabatic flag). */
export const ADIABATIC_LIMIT = 0.1;

/** One state of the probe, as the panel and the text show it (numbers unformatted, in engine units). */
export interface ProbeRow {
  m: number;
  nu: number;
  parity: LevelState['parity'];
  bindingHartree: number;
  /** Adiabatic-validity ratio ε/B (fixed-atom reduction trusted below 0.1). */
  bindingOverB: number;
  relError: number;
  /** Γ in hartree (moving ion; 0 = no decay channel, +Infinity = destroyed); null for a fixed atom or a state below the floor. */
  widthHartree: number | null;
  /** ħ/Γ in seconds; null as for the width. */
  lifetimeSeconds: number | null;
  /** 'bound' | 'resonance' | 'unbound' for a moving ion; a fixed atom's state is bound unless it is below the floor. */
  class: 'bound' | 'resonance' | 'unbound' | 'below floor';
  /** Thermal ensemble: fractions bound / resonance / unbound. */
  fractions: { bound: number; resonance: number; unbound: number } | null;
  flags: string[];
}

/** Joins the fixed-atom levels with the engine's moving-ion results (same order) into the rows of the probe. */
export function probeRows(levels: readonly LevelState[], motion: readonly MotionStateResult[] | null): ProbeRow[] {
  return levels.map((s, k) => {
    const below = s.flags.includes('below-floor');
    const mv = motion?.[k] ?? null;
    if (mv && (mv.m !== s.m || mv.nu !== s.nu)) throw new Error(`probeRows: motion state ${k} is (${mv.m}, ${mv.nu}), expected (${s.m}, ${s.nu})`);
    return {
      m: s.m,
      nu: s.nu,
      parity: s.parity,
      bindingHartree: s.bindingHartree,
      bindingOverB: s.bindingOverB,
      relError: s.relError,
      widthHartree: mv && !below ? mv.widthHartree : null,
      lifetimeSeconds: mv && !below ? mv.lifetimeSeconds : null,
      class: below ? 'below floor' : mv ? mv.class : 'bound',
      fractions: mv && !below ? (mv.fractions ?? null) : null,
      flags: [...s.flags, ...(mv && !below ? mv.flags.map((f) => `motion:${f}`) : [])],
    };
  });
}

/** Width in the chosen unit: "0 (channel closed)", "destroyed", or the number. */
export function widthText(row: ProbeRow, energyUnit: MapSetup['display']['energyUnit'], digits = 3): string {
  if (row.widthHartree === null) return '—';
  if (row.widthHartree === Infinity) return 'destroyed';
  if (row.widthHartree === 0) return '0';
  return formatScientific(energyToDisplay(row.widthHartree, energyUnit), { digits });
}

/** Lifetime ħ/Γ: "∞" without decay, "0" when destroyed. */
export function lifetimeText(row: ProbeRow, digits = 3): string {
  if (row.lifetimeSeconds === null) return '—';
  if (row.lifetimeSeconds === Infinity) return '∞';
  return formatScientific(row.lifetimeSeconds, { digits });
}

/**
 * A formatted number for a narrow table cell: narrow no-break spaces around "×" ("7.08 × 10⁻⁵" stays one
 * unbreakable, shorter run; it reads back the same).
 */
export function tightNumber(text: string): string {
  return text.replace(/ × /g, '\u202f×\u202f');
}

const percent = (x: number) => `${formatScientific(100 * x, { digits: 3, plainMin: 0.01 })} %`;

/** Class, with the thermal fractions when there are any: "bound (bound 99.2 %, resonance 0.8 %, unbound 0 %)". */
export function classText(row: ProbeRow): string {
  if (!row.fractions) return row.class;
  const f = row.fractions;
  return `${row.class} at kT (bound ${percent(f.bound)}, resonance ${percent(f.resonance)}, unbound ${percent(f.unbound)})`;
}

/** The setup's ion motion in words, for the probe's header line. */
export function motionText(setup: MapSetup): string {
  const m = setup.motion;
  const tail = `ion mass number ${setup.ion.massNumber}, observation time ${formatScientific(setup.observationTimeSeconds, { digits: 6 })} s`;
  switch (m.kind) {
    case 'none':
      return 'atom held fixed (no ion motion: no widths)';
    case 'kinetic-energy':
      return `transverse kinetic energy ${formatScientific(m.energyKelvin, { digits: 6 })} K; ${tail}`;
    case 'ion-level':
      return `ion Landau level N = ${m.level}; ${tail}`;
    case 'temperature':
      return `thermal ions at ${formatScientific(m.kelvin, { digits: 6 })} K (width and class at E⊥ = kT; fractions over the ensemble); ${tail}`;
  }
}

/** The probe as plain text (for "Copy as text"): the point, the setup numbers, one tab-separated line per state. */
export function probeAsText(point: ProbePoint, setup: MapSetup, rows: readonly ProbeRow[]): string {
  const { alphaUnit, fieldUnit, energyUnit } = setup.display;
  const e = ENERGY_UNIT_LABEL[energyUnit];
  const lines = [
    'Fieldbound probe (model estimate: adiabatic single-orbital approximation; widths from the moving-ion width table)',
    `α = ${formatScientific(alphaToDisplay(point.alpha, alphaUnit), { digits: 6 })} ${ALPHA_UNIT_LABEL[alphaUnit]} (${formatScientific(point.alpha, { digits: 6 })} a₀³)`,
    `B = ${formatScientific(fieldTeslaToDisplay(point.tesla, fieldUnit), { digits: 6 })} ${FIELD_UNIT_LABEL[fieldUnit]} (${formatScientific(point.tesla, { digits: 6 })} T)`,
    `cutoff radius r_c = ${formatScientific(setup.shortRange.cutoffBohr, { digits: 6 })} a₀; orbitals m = 0…${setup.orbitals.mMax}`,
    `ion motion: ${motionText(setup)}`,
    '',
    ['m', 'ν', 'parity', `binding energy (${e})`, `width Γ (${e})`, 'lifetime ħ/Γ (s)', 'class', 'ε/B (adiabatic < 0.1)', 'rel. error', 'flags'].join('\t'),
    ...rows.map((r) =>
      [
        r.m,
        r.nu,
        r.parity,
        formatScientific(energyToDisplay(r.bindingHartree, energyUnit), { digits: 6 }),
        widthText(r, energyUnit, 4),
        lifetimeText(r, 4),
        classText(r),
        formatScientific(r.bindingOverB, { digits: 4 }),
        formatScientific(r.relError, { digits: 2 }),
        r.flags.map((f) => FLAG_TEXT[f]?.label ?? f).join(', ') || '—',
      ].join('\t'),
    ),
  ];
  return lines.join('\n');
}
