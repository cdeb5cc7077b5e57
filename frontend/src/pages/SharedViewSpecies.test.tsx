import { afterEach, describe, expect, it, vi } from 'vitest';
import { configure, screen, waitFor } from '@testing-library/react';
import { Route, Routes } from 'react-router-dom';
import { defaultSetup, type SharedMapView, type SharedSpecies } from '@fieldbound/shared';
import type { ExplorerPageProps } from '../features/explorer/ExplorerPage';
import { fakeApi } from '../features/maps/testApi';
import { FakeEngineWorker, fakeEngineApi } from '../workers/fakeWorkers';
import { geometryFromFields } from '../features/map-render/mapGeometry';
import { renderWithProviders } from '../test-utils';
import { SharedLecturePage } from './LecturePages';
import { SharedMapPage } from './SharedMapPage';

// The real explorer and map view draw the overlay; only the workers are doubles and the map gets a size (the test DOM
// lays nothing out).
vi.mock('../features/explorer/ExplorerPage', async (importOriginal) => {
  const actual = await importOriginal<typeof import('../features/explorer/ExplorerPage')>();
  const engine = () => new FakeEngineWorker(fakeEngineApi()) as unknown as Worker;
  const contours = () => new FakeEngineWorker({ geometry: geometryFromFields }) as unknown as Worker;
  return { ...actual, ExplorerPage: (props: ExplorerPageProps) => <actual.ExplorerPage {...props} createEngineWorker={engine} createContourWorker={contours} poolSize={1} /> };
});
vi.mock('../features/explorer/useElementSize', () => ({ useElementSize: () => ({ width: 900, height: 520 }) }));
vi.setConfig({ testTimeout: 60_000 });
configure({ asyncUtilTimeout: 15_000 });

afterEach(() => {
  vi.restoreAllMocks();
});

const magnesium: SharedSpecies = {
  origin: 'catalogue',
  list: null,
  symbol: 'Mg',
  name: 'Magnesium',
  atomicNumber: 12,
  polarizability: { value: 71.2, uncertainty: 3, entered: null, source: 'Catalogue alpha source', status: 'confirmed' },
  electronAffinity: { valueEv: null, uncertaintyEv: null, stableAnion: false, source: 'Catalogue EA source', status: 'confirmed', note: null },
  massNumber: 24,
  massSource: 'Mass source',
};
const groupCaesium: SharedSpecies = {
  origin: 'team',
  list: { name: 'Group values' },
  symbol: null,
  name: 'Cs (our fit)',
  atomicNumber: null,
  polarizability: { value: 401.2, uncertainty: 0.5, entered: null, source: 'Group calculation 2026', status: null },
  electronAffinity: { valueEv: 0.4716, uncertaintyEv: null, stableAnion: true, source: 'Group calculation 2026', status: null, note: null },
  massNumber: 133,
  massSource: 'Group calculation 2026',
};
const view: SharedMapView = {
  title: 'Shortlist for the seminar',
  description: '',
  setup: { ...defaultSetup(), grid: { nAlpha: 4, nField: 4 }, species: ['Mg', 'Cs (our fit)'] },
  species: [magnesium, groupCaesium],
  pins: null,
};

function open(path: string) {
  fakeApi({ 'GET /api/view/tok-1': () => ({ status: 200, body: view }) });
  return renderWithProviders(
    <Routes>
      <Route path="/view/:token" element={<SharedMapPage />} />
      <Route path="/view/:token/present" element={<SharedLecturePage />} />
    </Routes>,
    { path },
  );
}

/** The drawn species markers: label, hover text, whether a field-free anion exists, and the uncertainty band's presence. */
async function drawnMarkers(container: HTMLElement) {
  await waitFor(() => expect(container.querySelectorAll('.map-view g.species-marker').length).toBeGreaterThan(0));
  return [...container.querySelectorAll('.map-view g.species-marker')].map((g) => ({
    label: g.querySelector('text')?.textContent,
    hover: g.querySelector('title')?.textContent,
    anion: g.getAttribute('data-anion'),
    band: g.querySelector('rect') !== null,
  }));
}

const EXPECTED = [
  { label: 'Mg', hover: 'Magnesium (Mg)\nα = 71.2 a₀³ ± 3 — Catalogue alpha source\nno stable field-free negative ion', anion: 'false', band: true },
  { label: 'Cs (our fit)', hover: 'Cs (our fit) · list Group values\nα = 401.2 a₀³ ± 0.5 — Group calculation 2026\nelectron affinity 0.4716 eV — Group calculation 2026', anion: 'true', band: true },
];

describe('species overlay of a viewing link', () => {
  it('the shared map draws the markers the setup names from the link’s species, with sources on hover', async () => {
    const { container } = open('/view/tok-1');
    expect(await screen.findByRole('heading', { name: 'Shortlist for the seminar' })).toBeTruthy();
    // Magnesium is named by its symbol in the setup, so it is drawn once, labelled "Mg".
    expect(await drawnMarkers(container)).toEqual(EXPECTED);
  });

  it('the lecture view of the link draws the same markers', async () => {
    const { container } = open('/view/tok-1/present');
    expect(await screen.findByTestId('lecture-view')).toBeTruthy();
    expect(await drawnMarkers(container)).toEqual(EXPECTED);
  });
});
