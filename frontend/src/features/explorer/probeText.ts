import type { LevelState, MapSetup } from '@fieldbound/shared';
import { ALPHA_UNIT_LABEL, ENERGY_UNIT_LABEL, FIELD_UNIT_LABEL, alphaToDisplay, energyToDisplay, fieldTeslaToDisplay } from '../map-render/displayUnits';
import { formatScientific } from '../map-render/formatNumber';
import type { ProbePoint } from './viewState';

/** Plain words for the engine's validity flags. */
export const FLAG_TEXT: Record<string, { label: string; meaning: string }> = {
  'cutoff-dominated': { label: 'cutoff-dominated', meaning: 'm = 0 with α/r_c² ≳ 1: the value depends on the cutoff radius.' },
  'non-adiabatic': { label: 'non-adiabatic', meaning: 'ε/B > 0.1: binding not small against the Landau spacing; the single-orbital approximation is doubtful.' },
  'field-free-anion': { label: 'field-free anion', meaning: 'This atom has a field-free negative ion, which the model does not describe (m = 0 channel).' },
  'below-floor': { label: 'below floor', meaning: 'Bound more weakly than the energy floor: counted as not bound on the map.' },
  unresolved: { label: 'unresolved', meaning: 'Counted, but bound more weakly than the solver’s smallest searched energy.' },
};

/** The probe as plain text (for "Copy as text"): the point, the setup numbers, one line per state. */
export function probeAsText(point: ProbePoint, setup: MapSetup, states: readonly LevelState[]): string {
  const { alphaUnit, fieldUnit, energyUnit } = setup.display;
  const e = ENERGY_UNIT_LABEL[energyUnit];
  const lines = [
    'Fieldbound probe (model estimate: adiabatic single-orbital approximation, atom held fixed)',
    `α = ${formatScientific(alphaToDisplay(point.alpha, alphaUnit), { digits: 6 })} ${ALPHA_UNIT_LABEL[alphaUnit]} (${formatScientific(point.alpha, { digits: 6 })} a₀³)`,
    `B = ${formatScientific(fieldTeslaToDisplay(point.tesla, fieldUnit), { digits: 6 })} ${FIELD_UNIT_LABEL[fieldUnit]} (${formatScientific(point.tesla, { digits: 6 })} T)`,
    `cutoff radius r_c = ${formatScientific(setup.shortRange.cutoffBohr, { digits: 6 })} a₀; orbitals m = 0…${setup.orbitals.mMax}`,
    '',
    ['m', 'ν', 'parity', `binding energy (${e})`, 'ε/B', 'rel. error', 'flags'].join('\t'),
    ...states.map((s) =>
      [s.m, s.nu, s.parity, formatScientific(energyToDisplay(s.bindingHartree, energyUnit), { digits: 6 }), formatScientific(s.bindingOverB, { digits: 4 }), formatScientific(s.relError, { digits: 2 }), s.flags.join(', ') || '—'].join('\t'),
    ),
  ];
  return lines.join('\n');
}
