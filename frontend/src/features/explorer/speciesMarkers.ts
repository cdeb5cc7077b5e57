import type { SpeciesEntry } from '@fieldbound/shared';
import type { SpeciesMarker } from './MapView';

/** What a marker needs of a species: a team member's `SpeciesEntry` and a link holder's `SharedSpecies` both have it. */
export type SpeciesMarkerSource = Pick<SpeciesEntry, 'name' | 'symbol' | 'polarizability' | 'electronAffinity'> & { list: { name: string } | null };

/** Species of the catalogue and the team's lists as overlay markers, findable by name and (catalogue) by symbol. */
export function speciesMarkers(entries: readonly SpeciesMarkerSource[]): SpeciesMarker[] {
  const out: SpeciesMarker[] = [];
  for (const s of entries) {
    const ea = s.electronAffinity;
    const details = [
      `${s.name}${s.symbol ? ` (${s.symbol})` : ''}${s.list ? ` · list ${s.list.name}` : ''}`,
      `α = ${s.polarizability.value} a₀³${s.polarizability.uncertainty !== null ? ` ± ${s.polarizability.uncertainty}` : ''} — ${s.polarizability.source}`,
      ea.stableAnion && ea.valueEv !== null ? `electron affinity ${ea.valueEv} eV — ${ea.source ?? 'no source given'}` : 'no stable field-free negative ion',
    ].join('\n');
    const marker = { name: s.name, alphaAu: s.polarizability.value, alphaUncertaintyAu: s.polarizability.uncertainty ?? 0, hasFieldFreeAnion: ea.stableAnion, details };
    out.push(marker);
    if (s.symbol && s.symbol !== s.name) out.push({ ...marker, name: s.symbol });
  }
  return out;
}
