import { memo, startTransition, useCallback, useEffect, useMemo, useRef, useState, type CSSProperties, type ReactNode } from 'react';
import { useSearchParams } from 'react-router-dom';
import { Button, Select, Space, Tooltip, Typography } from 'antd';
import { CompressOutlined, MenuFoldOutlined, MenuUnfoldOutlined } from '@ant-design/icons';
import { canonicalJson, defaultSetup, teslaToAtomic, validateSetup, type BindingMapResult, type MapSetup, type PhaseMapResult, type Tesla } from '@fieldbound/shared';
import type { MapOverlayContext } from '../map-render/mapOverlay';
import { palette } from '../../theme/palette';
import { ENERGY_UNIT_LABEL } from '../map-render/displayUnits';
import type { ShownQuantity } from '../map-render/regionField';
import { ContourClient } from '../../workers/contourClient';
import { createContourWorker, createEngineWorker } from '../../workers/createWorkers';
import { EnginePool, defaultPoolSize } from '../../workers/enginePool';
import { ComputeStatus } from './ComputeStatus';
import { MapLegend } from './MapLegend';
import { MapView, gridAxesOf, type MapLayerInput, type SpeciesMarker } from './MapView';
import { ProbeDrawer } from './ProbeDrawer';
import { useElementSize } from './useElementSize';
import { OpenedOnce } from '../../components/OpenedOnce';
import { SetupPanel } from './SetupPanel';
import { createMapCaches, motionKey, useMapComputation } from './hooks/useMapComputation';
import { useLayerGeometry, type LayerGeometry } from './hooks/useLayerGeometry';
import { readoutAt } from './mapReadout';
import { changesBinding, checkDraft, validateDraft, type SetupDraft } from './setupDraft';
import { parseViewParams, roundProbe, sameWindow, setupWindow, shownKey, windowSetup, writeViewParams, type ProbePoint, type ViewWindow } from './viewState';

export interface ExplorerPageProps {
  /** The setup to open with (a saved map's); a new map starts from `defaultSetup()`. */
  initialSetup?: MapSetup;
  /** Seam for saving (the saved-maps feature): called with the current valid setup. */
  onSaveSetup?: (setup: MapSetup) => void;
  saveLabel?: string;
  /** Atoms the overlay can show, looked up by the setup's species names (the species catalogue plugs in here). */
  speciesCatalogue?: readonly SpeciesMarker[];
  /** Worker constructors (tests pass fakes; the app uses the real module workers). */
  createEngineWorker?: () => Worker;
  createContourWorker?: () => Worker;
  /** Longest a map pass may run before it is stopped with a message. Default 10 minutes. */
  timeoutMs?: number;
  /** Map workers; default one per core (1…4). */
  poolSize?: number;
  style?: CSSProperties;
  /** Saved-maps seam: no setup panel and no save (viewing links, viewers); the probe stays. */
  readOnly?: boolean;
  /** Saved-maps seam: the valid setup of the form (null while it has errors), whenever it changes. */
  onSetupChange?: (setup: MapSetup | null) => void;
  /** Saved-maps seam: a full-grid computation finished (for the result summary, thumbnail and export). */
  onComputed?: (computed: ExplorerComputed) => void;
  /** Pins seam: drawn over the map in data coordinates, with the finished full-grid classes to read regions from. */
  overlay?: (ctx: ExplorerOverlayContext) => ReactNode;
}

/** The finished full-grid computation the regions are read from (null while computing or applying ion motion). */
export interface ExplorerRegions {
  binding: BindingMapResult;
  phase: PhaseMapResult | null;
  setup: MapSetup;
  shown: ShownQuantity;
}
export type ExplorerOverlayContext = MapOverlayContext & { regions: ExplorerRegions | null };

/** What `onComputed` reports: the full-grid result, the setup it belongs to and its wall time. */
export interface ExplorerComputed {
  setup: MapSetup;
  result: BindingMapResult;
  fullMs: number | null;
  /** Moving-ion classes of `result` (null for a fixed atom), for the ion-motion settings `phaseMotionKey` (see `motionKey`). */
  phase: PhaseMapResult | null;
  phaseMotionKey: string | null;
}

const NO_SPECIES: readonly SpeciesMarker[] = [];

/** Narrowest map (px) worth keeping beside the open probe; with less room the probe lies over the map. */
const MIN_MAP_BESIDE_PROBE = 320;
/** Below this width of the map column (px) the legend starts folded, so it does not hide most of the map. */
const NARROW_MAP_PX = 600;


/** Applies the URL's shown orbital to a setup when it is valid there. */
function withShown(setup: MapSetup, shown: ShownQuantity | null): MapSetup {
  if (!shown) return setup;
  const next = { ...setup, display: { ...setup.display, shown } };
  return validateSetup(next).ok ? next : setup;
}

/**
 * The map explorer: the setup on the left, the map filling the page, the probe in a drawer on the right.
 * All engine work runs in workers; the URL keeps the zoom window, the shown orbital and the probe point.
 * Memoised: a host page's own renders (save state, dialogs, pins) pass it by while its props stay the same.
 */
export const ExplorerPage = memo(function ExplorerPage({
  initialSetup,
  onSaveSetup,
  saveLabel,
  speciesCatalogue = NO_SPECIES,
  createEngineWorker: makeEngineWorker = createEngineWorker,
  createContourWorker: makeContourWorker = createContourWorker,
  timeoutMs = 600_000,
  poolSize,
  style,
  readOnly = false,
  onSetupChange,
  onComputed,
  overlay,
}: ExplorerPageProps) {
  const [params, setParams] = useSearchParams();
  const fromUrl = useMemo(() => parseViewParams(params), []); // read once, when the page opens
  const [applied, setApplied] = useState<MapSetup>(() => withShown(initialSetup ?? defaultSetup(), fromUrl.shown));
  const [draft, setDraft] = useState<SetupDraft>(applied);
  const [view, setView] = useState<ViewWindow>(() => fromUrl.view ?? setupWindow(applied));
  const [probe, setProbe] = useState<ProbePoint | null>(fromUrl.probe);
  const [panelOpen, setPanelOpen] = useState(true);

  // Workers: a pool for maps, one engine worker for the probe (never queued behind a map), one for contours.
  const [workers, setWorkers] = useState<{ maps: EnginePool; probe: EnginePool; contours: ContourClient } | null>(null);
  useEffect(() => {
    const w = {
      maps: new EnginePool({ createWorker: makeEngineWorker, size: poolSize ?? defaultPoolSize(navigator.hardwareConcurrency) }),
      probe: new EnginePool({ createWorker: makeEngineWorker, size: 1 }),
      contours: new ContourClient(makeContourWorker),
    };
    // At once, not as a transition: with a transition here the e2e faults drill (workers killed mid-computation) missed its error in 2 of 3 runs.
    setWorkers(w);
    return () => {
      w.maps.dispose();
      w.probe.dispose();
      w.contours.dispose();
    };
  }, [makeEngineWorker, makeContourWorker, poolSize]);

  const caches = useRef(createMapCaches()).current;
  const base = useMapComputation(workers?.maps ?? null, applied, caches, { timeoutMs, label: 'map' });
  const zoomed = useMemo(() => (sameWindow(view, setupWindow(applied)) ? null : windowSetup(applied, view)), [view, applied]);
  const windowComp = useMapComputation(workers?.maps ?? null, zoomed, caches, { timeoutMs, label: 'window' });

  // Saved-maps seams: report the form's valid setup and each finished full-grid computation.
  // The form's validation depends on the draft alone: pressing Compute (a new applied setup) keeps the same valid
  // setup and issues, so neither the host page nor the form fields re-render for it.
  const validated = useMemo(() => validateDraft(draft), [draft]);
  const validDraft = validated.valid;
  // Reported when its content changes (not when the page opens with the setup it was given): every report
  // re-renders the host page.
  const reportedSetup = useRef<string | null | undefined>(initialSetup ? canonicalJson(initialSetup) : undefined);
  useEffect(() => {
    const text = validDraft ? canonicalJson(validDraft) : null;
    if (text === reportedSetup.current) return;
    reportedSetup.current = text;
    onSetupChange?.(validDraft);
  }, [validDraft, onSetupChange]);
  const { status: baseStatus, result: baseResult, resultSetup: baseResultSetup, resultPass: basePass } = base.state;
  const baseFullMs = base.state.timings.fullMs;
  // Reported again when the moving-ion classes arrive or change (motion settings reuse the binding map).
  const basePhase = base.motionWanted ? base.phase : null;
  const basePhaseKey = basePhase ? motionKey(applied) : null;
  useEffect(() => {
    // As a transition: what the host page does with a finished map (summary, export state) renders in slices.
    if (baseStatus === 'done' && basePass === 'full' && baseResult && baseResultSetup)
      startTransition(() => onComputed?.({ setup: baseResultSetup, result: baseResult, fullMs: baseFullMs, phase: basePhase, phaseMotionKey: basePhaseKey }));
  }, [baseStatus, basePass, baseResult, baseResultSetup, baseFullMs, basePhase, basePhaseKey, onComputed]);

  // Kept by value: a newly applied setup with the same shown quantity, levels and species changes nothing drawn.
  const appliedShownKey = shownKey(applied.display.shown);
  const shown = useMemo(() => applied.display.shown, [appliedShownKey]);
  const levelsKey = applied.contours.levelsKelvin.join(',');
  const levels = useMemo(() => applied.contours.levelsKelvin, [levelsKey]);
  const speciesKey = applied.species.join('\n');
  // Ion motion: classes from the engine's phaseMap on the binding energies computed (never recomputed for motion).
  const baseGeometry = useLayerGeometry(workers?.contours ?? null, base.state.result, base.state.resultSetup, base.motionWanted ? base.phase : null, shown, levels, base.motionWanted);
  const windowGeometry = useLayerGeometry(workers?.contours ?? null, zoomed ? windowComp.state.result : null, windowComp.state.resultSetup, windowComp.motionWanted ? windowComp.phase : null, shown, levels, windowComp.motionWanted);
  const motionApplied = base.motionWanted && base.phase !== null;
  const regions = useMemo<ExplorerRegions | null>(
    () => (baseStatus === 'done' && basePass === 'full' && baseResult && baseResultSetup && (!base.motionWanted || base.phase) ? { binding: baseResult, phase: base.phase, setup: baseResultSetup, shown } : null),
    [baseStatus, basePass, baseResult, baseResultSetup, base.motionWanted, base.phase, shown],
  );
  const mapOverlay = useMemo(() => (overlay ? (ctx: MapOverlayContext) => overlay({ ...ctx, regions }) : undefined), [overlay, regions]);

  const layers = useMemo(() => {
    const out: MapLayerInput[] = [];
    const add = (key: string, g: LayerGeometry) => {
      if (g.geometry && g.forResult && g.forSetup && g.forResult.nAlpha === g.forSetup.grid.nAlpha && g.forResult.nField === g.forSetup.grid.nField) {
        out.push({ key, result: g.forResult, setup: g.forSetup, geometry: g.geometry, phase: g.forPhase });
      }
    };
    add('base', baseGeometry);
    // A window drawn for an earlier zoom stays until the new one is there (it is clipped to its own extent).
    if (zoomed) add('window', windowGeometry);
    return out;
  }, [baseGeometry, windowGeometry, zoomed]);

  // User Timing marks for the benchmark: when the first picture and the full map of a computation are on screen.
  const drawnMarks = useRef(new WeakSet<BindingMapResult>());
  useEffect(() => {
    for (const [label, comp, g] of [['map', base.state, baseGeometry], ['window', windowComp.state, windowGeometry]] as const) {
      const r = g.forResult;
      if (!r || r !== comp.result || drawnMarks.current.has(r)) continue;
      drawnMarks.current.add(r);
      performance.mark(`fieldbound:${label}:${comp.resultPass === 'full' ? 'full' : 'coarse'}-drawn`);
    }
  }, [layers, base.state, windowComp.state, baseGeometry, windowGeometry]);

  // Keep the view state in the URL (replace, so the back button leaves the page rather than stepping zooms). Like the
  // whole-map window, the saved map's own shown quantity is not added when the address has none: a link without it
  // opens the same view, and opening a map does not rewrite its address (a router navigation that re-renders the page
  // in its first task). An address that names it keeps it.
  const openedShownKey = useRef(fromUrl.shown ? null : shownKey((initialSetup ?? defaultSetup()).display.shown)).current;
  useEffect(() => {
    const next = writeViewParams(params, {
      view: sameWindow(view, setupWindow(applied)) ? null : view,
      shown: shownKey(shown) === openedShownKey ? null : shown,
      probe,
    });
    if (next.toString() !== params.toString()) setParams(next, { replace: true });
  }, [view, shown, probe, applied, params, setParams, openedShownKey]);

  const check = useMemo(() => ({ ...validated, needsCompute: changesBinding(validated.valid, applied) }), [validated, applied]);
  // Stable across applied setups (read through a ref), so the memoised form fields keep their props.
  const appliedRef = useRef(applied);
  appliedRef.current = applied;
  const onDraftChange = useCallback((d: SetupDraft) => {
    setDraft(d);
    const c = checkDraft(d, appliedRef.current);
    // Display, contours, motion and observation time apply at once: they never recompute binding energies.
    if (c.valid && !c.needsCompute) setApplied(c.valid);
  }, []);
  // Read through a ref too: typing a valid value gives a new valid setup but must not re-render the buttons.
  const checkRef = useRef(check);
  checkRef.current = check;
  const onCompute = useCallback(() => {
    const next = checkRef.current.valid;
    const current = appliedRef.current;
    if (!next) return;
    const axesChanged = next.alphaAxis.min !== current.alphaAxis.min || next.alphaAxis.max !== current.alphaAxis.max || next.fieldAxis.min !== current.fieldAxis.min || next.fieldAxis.max !== current.fieldAxis.max || next.alphaAxis.scale !== current.alphaAxis.scale || next.fieldAxis.scale !== current.fieldAxis.scale;
    // As a transition: the click itself only handles the input (the button's feedback paints at once); the page
    // renders the new setup in slices in the next tasks, and the computation starts from there.
    startTransition(() => {
      setApplied(next);
      if (axesChanged) setView(setupWindow(next));
    });
  }, []);

  const setShown = useCallback((s: ShownQuantity) => {
    setApplied((a) => ({ ...a, display: { ...a.display, shown: s } }));
    setDraft((d) => ({ ...d, display: { ...d.display, shown: s } }));
  }, []);

  const readout = useCallback(
    (alphaAu: number, tesla: number) => {
      const fieldAu = teslaToAtomic(tesla as Tesla) as number;
      for (const layer of [...layers].reverse()) {
        const axes = gridAxesOf(layer.result, layer.setup);
        const text = readoutAt(layer.result, axes.alpha, axes.field, alphaAu, fieldAu, shown, applied.display.energyUnit, layer.phase ?? null);
        if (text) return text;
      }
      return null;
    },
    [layers, shown, applied.display.energyUnit],
  );

  const onProbe = useCallback((p: ProbePoint) => setProbe(roundProbe(p)), []);
  const closeProbe = useCallback(() => setProbe(null), []);
  // The open probe lies over the right of the explorer: the map column gives it that width (the map is redrawn beside
  // it, so the probed point stays in view) unless that would leave the map narrower than MIN_MAP_BESIDE_PROBE.
  const [probeCover, setProbeCover] = useState(0);
  const mainRef = useRef<HTMLElement>(null);
  const { width: mainWidth } = useElementSize(mainRef);
  const mapMarginRight = probe !== null && probeCover > 0 && mainWidth - probeCover >= MIN_MAP_BESIDE_PROBE ? probeCover : 0;
  // Offered while the draft is valid; stable while it stays valid (it saves the newest valid setup), so neither
  // progress renders of the page nor keystrokes re-render the setup's buttons.
  const hasValidSetup = check.valid !== null;
  const onSaveValid = useMemo(
    () =>
      onSaveSetup && hasValidSetup
        ? () => {
            const valid = checkRef.current.valid;
            if (valid) onSaveSetup(valid);
          }
        : undefined,
    [onSaveSetup, hasValidSetup],
  );
  const species = useMemo(() => speciesCatalogue.filter((s) => applied.species.includes(s.name)), [speciesCatalogue, speciesKey]);
  // One choice per atom (the catalogue lists an atom under its name and its symbol; the shorter one is stored).
  const speciesOptions = useMemo(() => {
    const byAtom = new Map<string, SpeciesMarker>();
    for (const s of speciesCatalogue) {
      const seen = byAtom.get(s.details);
      if (!seen || s.name.length < seen.name.length) byAtom.set(s.details, s);
    }
    return [...byAtom.values()].sort((a, b) => a.alphaAu - b.alphaAu).map((s) => ({ value: s.name, label: `${s.details.split('\n')[0]} · α = ${s.alphaAu} a₀³` }));
  }, [speciesCatalogue]);
  const maxCount = layers.length ? Math.max(...layers.map((l) => l.geometry.maxCount)) : 0;
  const activeComp = zoomed && windowComp.state.status !== 'idle' && windowComp.state.status !== 'done' ? windowComp : base;
  const geometryError = baseGeometry.error ?? windowGeometry.error;
  const fullTiming = base.state.timings;

  const hidePanel = useCallback(() => setPanelOpen(false), []);
  const showPanel = useCallback(() => setPanelOpen(true), []);
  const showWholeMap = useCallback(() => setView(setupWindow(appliedRef.current)), []);
  const statusText =
    `${applied.grid.nAlpha} × ${applied.grid.nField} grid · orbitals m = 0…${applied.orbitals.mMax} · energies in ${ENERGY_UNIT_LABEL[applied.display.energyUnit]}` +
    (fullTiming.fullMs !== null ? ` · computed in ${(fullTiming.fullMs / 1000).toFixed(1)} s` : '') +
    (fullTiming.fullMs !== null && fullTiming.firstPictureMs !== null && fullTiming.firstPictureMs < fullTiming.fullMs ? ` (first picture ${(fullTiming.firstPictureMs / 1000).toFixed(2)} s)` : '') +
    (base.state.resultPass === 'coarse' ? ' · showing the quick first pass' : '');

  return (
    <div className="explorer-page" style={{ position: 'relative', overflow: 'hidden', display: 'flex', height: 'calc(100vh - 48px)', minHeight: 420, background: palette.paper, ...style }}>
      {panelOpen && !readOnly && (
        <aside aria-label="Setup" style={{ width: 320, flex: 'none', overflowY: 'auto', padding: '8px 14px 24px', borderRight: `1px solid ${palette.unbound}`, background: '#fff' }}>
          <SetupHeader onHide={hidePanel} />
          <SetupPanel draft={draft} issues={check.issues} onChange={onDraftChange} onCompute={onCompute} needsCompute={check.needsCompute} onSave={onSaveValid} saveLabel={saveLabel} speciesOptions={speciesOptions.length ? speciesOptions : undefined} />
        </aside>
      )}
      <main ref={mainRef} style={{ flex: 1, minWidth: 0, display: 'flex', flexDirection: 'column', paddingRight: mapMarginRight }}>
        <ExplorerToolbar onShowSetup={!panelOpen && !readOnly ? showPanel : undefined} shown={shown} mMax={applied.orbitals.mMax} onShownChange={setShown} zoomed={zoomed !== null} onShowWhole={showWholeMap} status={statusText} />
        <div style={{ position: 'relative', flex: 1, minHeight: 0, display: 'flex' }}>
          <MapView setup={applied} view={view} onViewChange={setView} layers={layers} readout={readout} probe={probe} onProbe={onProbe} species={species} overlay={mapOverlay} />
          <MapLegend shown={shown} maxCount={maxCount} energyUnitLabel={ENERGY_UNIT_LABEL[applied.display.energyUnit]} motionApplied={motionApplied} hasSpecies={species.length > 0} hasFieldBands={applied.fieldBands.length > 0} narrow={mainWidth > 0 && mainWidth - mapMarginRight < NARROW_MAP_PX} />
          <div style={{ position: 'absolute', top: 12, left: '50%', transform: 'translateX(-50%)', display: 'flex', flexDirection: 'column', gap: 8, alignItems: 'center' }}>
            <ComputeStatus state={activeComp.state} progress={activeComp.progress} onCancel={activeComp.cancel} onRetry={activeComp.retry} what={activeComp === base ? 'the map' : 'the zoomed window'} />
            {geometryError && <ComputeStatus state={{ ...base.state, status: 'error', error: geometryError }} onCancel={() => {}} onRetry={base.retry} what="the contours" />}
          </div>
        </div>
        <footer style={{ padding: '4px 12px', fontSize: 11.5, color: '#5b5d70', borderTop: `1px solid ${palette.unbound}`, background: '#fff' }}>
          Model estimate: an electron bound to a fixed polarizable atom in the adiabatic single-orbital approximation (one lowest-Landau-level orbital m at a time). Flags mark where it is doubtful: <b>cutoff-dominated</b> (m = 0 depends on the cutoff radius), <b>non-adiabatic</b> (ε/B &gt; 0.1). Binding weaker than the energy floor counts as unbound.
          {motionApplied ? ' Ion motion: a state is bound when its width Γ < ħ/τ (observation time τ), a resonance when Γ < ε, otherwise unbound; radiative decay, collisions and trap fields are not included.' : ''}
          {base.motionWanted && !motionApplied && base.state.result ? ' Applying ion motion…' : ''}
        </footer>
      </main>
      {/* Inside the explorer's box (not over the host page's header, whose Save and Export stay reachable). */}
      <OpenedOnce open={probe !== null}>
        <ProbeDrawer point={probe} setup={applied} pool={workers?.probe ?? null} onClose={closeProbe} onCoverChange={setProbeCover} />
      </OpenedOnce>
    </div>
  );
});

/** The setup column's title and its hide button (memoised: typing in the setup does not re-render it). */
const SetupHeader = memo(function SetupHeader({ onHide }: { onHide: () => void }) {
  return (
    <Space style={{ justifyContent: 'space-between', width: '100%' }}>
      <Typography.Title level={5} style={{ margin: '4px 0' }}>
        Setup
      </Typography.Title>
      <Tooltip title="Hide the setup">
        <Button type="text" size="small" aria-label="Hide the setup" icon={<MenuFoldOutlined />} onClick={onHide} />
      </Tooltip>
    </Space>
  );
});

interface ExplorerToolbarProps {
  /** Shown while the setup column is hidden. */
  onShowSetup?: () => void;
  shown: ShownQuantity;
  mMax: number;
  onShownChange: (shown: ShownQuantity) => void;
  zoomed: boolean;
  onShowWhole: () => void;
  status: string;
}

/** The bar above the map: what the regions show, back to the whole map, and the computation's one-line status. */
const ExplorerToolbar = memo(function ExplorerToolbar({ onShowSetup, shown, mMax, onShownChange, zoomed, onShowWhole, status }: ExplorerToolbarProps) {
  const options = useMemo(() => [...Array.from({ length: mMax + 1 }, (_, m) => ({ value: `m${m}`, label: `Orbital m = ${m}` })), { value: 'survivors', label: 'Survivors' }], [mMax]);
  return (
    <div style={{ display: 'flex', alignItems: 'center', gap: 12, padding: '6px 12px', borderBottom: `1px solid ${palette.unbound}`, background: '#fff', flexWrap: 'wrap' }}>
      {onShowSetup && (
        <Tooltip title="Show the setup">
          <Button size="small" aria-label="Show the setup" icon={<MenuUnfoldOutlined />} onClick={onShowSetup} />
        </Tooltip>
      )}
      <Select
        size="small"
        aria-label="Regions show"
        value={shownKey(shown)}
        onChange={(v: string) => onShownChange(v === 'survivors' ? { kind: 'survivors' } : { kind: 'orbital', m: Number(v.slice(1)) })}
        options={options}
        style={{ width: 150 }}
      />
      <Button size="small" icon={<CompressOutlined />} disabled={!zoomed} onClick={onShowWhole}>
        Show the whole map
      </Button>
      <Typography.Text type="secondary" style={{ fontSize: 12 }}>
        {status}
      </Typography.Text>
    </div>
  );
});

export default ExplorerPage;
