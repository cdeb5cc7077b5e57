import { memo, useCallback, useDeferredValue, useEffect, useMemo, useRef, useState } from 'react';
import { App, Button, Space, Spin, Tooltip, Typography } from 'antd';
import { ArrowLeftOutlined, DesktopOutlined, HistoryOutlined, SaveOutlined, ShareAltOutlined } from '@ant-design/icons';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import { bindingInputsKey, canonicalJson, setupFingerprint, type BindingMapResult, type MapDetail, type MapSetup, type PhaseMapResult } from '@fieldbound/shared';
import { conflictOf, storeMap, useMap, usePutSummary, usePutThumbnail, useRestoreVersion, useSaveAsCopy, useUpdateMap, type UpdateMapVars } from '../api/maps';
import { useTeamSpecies } from '../api/species';
import { useCurrentTeam } from '../state/currentTeam';
import { ExplorerPage, type ExplorerComputed } from '../features/explorer/ExplorerPage';
import { motionKey } from '../features/explorer/hooks/useMapComputation';
import { speciesMarkers } from '../features/explorer/speciesMarkers';
import { ExportMenu } from '../features/export';
import { OpenedOnce } from '../components/OpenedOnce';
import { ConflictModal } from '../features/maps/ConflictModal';
import { ShareDialog } from '../features/maps/ShareDialog';
import { UnsavedChangesGuard } from '../features/maps/UnsavedChangesGuard';
import { VersionsDrawer } from '../features/maps/VersionsDrawer';
import { summaryRequest, thumbnailPng } from '../features/maps/resultSummary';
import { useMemberPins } from '../features/pins/MemberPins';
import { palette } from '../theme/palette';
import { ProblemState } from '../components/ProblemState';

/** Height of the map page's own bar under the app's top bar. */
const BAR_HEIGHT = 44;

/** Two setups are the same saved content when they differ at most in the shown orbital (view state kept in the URL). */
function sameContent(a: MapSetup, b: MapSetup): boolean {
  const strip = (s: MapSetup) => canonicalJson({ ...s, display: { ...s.display, shown: null } });
  return strip(a) === strip(b);
}

/** Runs `work` when the main thread is idle (soon after at the latest), or on the next task where there is no idle callback. */
function whenIdle(work: () => void) {
  if (typeof window.requestIdleCallback === 'function') window.requestIdleCallback(() => work(), { timeout: 2000 });
  else setTimeout(work, 0);
}

type SaveState = 'saved' | 'unsaved' | 'saving' | 'invalid';
const SAVE_STATE_TEXT: Record<SaveState, string> = { saved: 'Saved', unsaved: 'Unsaved changes', saving: 'Saving…', invalid: 'Unsaved changes (the setup has errors)' };

/** A saved map: loads it, opens the explorer with its setup, and saves, versions, shares and exports it. */
export function MapPage() {
  const { mapId } = useParams();
  const map = useMap(mapId);
  // When the map arrives, the editor and explorer mount in an interruptible background render (a deferred value)
  // instead of one long task; the spinner stays meanwhile. Later updates of the map (saves) render at once.
  const arrived = useDeferredValue(map.data !== undefined);
  if (map.isLoading || (map.data && !arrived)) {
    return (
      <div style={{ margin: 'auto', padding: 48 }}>
        <Spin tip="Opening the map…" size="large">
          <div style={{ width: 200, height: 80 }} />
        </Spin>
      </div>
    );
  }
  if (map.isError || !map.data) {
    return (
      <ProblemState
        error={map.error}
        what="this map"
        onRetry={() => map.refetch()}
        extra={
          <Link to="/maps">
            <Button>Back to the maps</Button>
          </Link>
        }
      />
    );
  }
  return <MapEditor key={map.data.id} map={map.data} />;
}

function MapEditor({ map }: { map: MapDetail }) {
  const { teams } = useCurrentTeam();
  const role = teams.find((t) => t.id === map.teamId)?.role ?? 'viewer';
  const canEdit = role === 'editor' || role === 'owner';
  const { message } = App.useApp();
  const navigate = useNavigate();
  const queryClient = useQueryClient();

  const update = useUpdateMap(map.id);
  const restoreVersion = useRestoreVersion(map.id);
  const saveAsCopy = useSaveAsCopy();
  const putSummary = usePutSummary(map.id);
  const putThumbnail = usePutThumbnail(map.id);
  const species = useTeamSpecies(map.teamId);
  const markers = useMemo(() => speciesMarkers(species.data ?? []), [species.data]);

  // The explorer is opened with the saved setup; bumping the key reopens it with the cache's (after reload/restore).
  const [explorerKey, setExplorerKey] = useState(0);
  const [openedWith, setOpenedWith] = useState(map.setup);
  const [current, setCurrent] = useState<MapSetup | null>(map.setup);
  const [computed, setComputed] = useState<ExplorerComputed | null>(null);
  const [conflict, setConflict] = useState<{ theirs: MapDetail; mine: { title: string; setup: MapSetup } } | null>(null);
  const [copyError, setCopyError] = useState<string | null>(null);
  const [versionsOpen, setVersionsOpen] = useState(false);
  const [shareOpen, setShareOpen] = useState(false);
  const explorerBox = useRef<HTMLDivElement>(null);
  const pins = useMemberPins({ mapId: map.id, mapVersion: map.version, canEdit });
  // Species and pins reach the explorer as deferred values: their arrival re-renders the page's header at once and the
  // explorer (setup form, map, overlay) in an interruptible background render, not in one long task.
  const explorerSpecies = useDeferredValue(markers);
  const explorerOverlay = useDeferredValue(pins.overlay);

  const dirty = canEdit && (current === null || !sameContent(current, map.setup));
  const saveState: SaveState = update.isPending || restoreVersion.isPending ? 'saving' : !dirty ? 'saved' : current === null ? 'invalid' : 'unsaved';
  const leaving = useRef(false);
  const shouldWarn = useCallback(() => !leaving.current && dirty, [dirty]);

  const reopen = useCallback((next: MapDetail) => {
    setOpenedWith(next.setup);
    setCurrent(next.setup);
    setComputed(null);
    setExplorerKey((k) => k + 1);
  }, []);

  const save = useCallback(
    (vars: UpdateMapVars) => {
      const mine = { title: vars.title ?? map.title, setup: vars.setup ?? current ?? map.setup };
      update.mutate(
        { expectedVersion: map.version, ...vars },
        {
          onSuccess: (saved) => message.success(`Saved as version ${saved.version}.`),
          onError: (error) => {
            const theirs = conflictOf(error);
            if (theirs) setConflict({ theirs, mine });
            else message.error(`Not saved: ${error.message}`);
          },
        },
      );
    },
    [update, map.version, map.title, map.setup, current, message],
  );

  // Stable (the latest `save` read through a ref): the memoised explorer is not re-rendered by the page's own state.
  const saveRef = useRef(save);
  saveRef.current = save;
  const onSaveSetup = useCallback((setup: MapSetup) => saveRef.current({ setup }), []);
  const explorerStyle = useMemo(() => ({ height: `calc(100vh - 48px - ${BAR_HEIGHT}px)` }), []);

  // Exports describe the figure as drawn: the current setup while it shares the computed binding map (species, field
  // bands, display and contours change without recomputing), else the setup that was computed.
  const exportSetup = computed && current && bindingInputsKey(current) === bindingInputsKey(computed.setup) ? current : (computed?.setup ?? current ?? map.setup);

  // Result summary and thumbnail: once per computed setup that is the saved one (editors only).
  const sent = useRef(new Set<string>());
  useEffect(() => {
    if (!canEdit || !computed || update.isPending) return;
    const fp = setupFingerprint(computed.setup);
    if (fp !== setupFingerprint(map.setup) || sent.current.has(fp)) return;
    const summaryCurrent = map.summary?.setupFingerprint === fp && map.summary.engineVersion === computed.result.engineVersion;
    if (summaryCurrent && map.thumbnailUrl) return;
    sent.current.add(fp);
    // In idle slices, one after the other: the counts pass and the picture's pixels stay out of the task that draws the map.
    const { setup, result, fullMs } = computed;
    whenIdle(() => {
      putSummary.mutate(summaryRequest(setup, result, fullMs));
      whenIdle(() => void thumbnailPng(result).then((png) => png && putThumbnail.mutate(png)));
    });
  }, [canEdit, computed, map.setup, map.summary, map.thumbnailUrl, update.isPending, putSummary, putThumbnail]);

  // Stable handlers for the memoised header parts (pins, species and live status arriving re-render the page, not them).
  const onRename = useCallback((title: string) => {
    const t = title.trim();
    if (t && t !== mapTitleRef.current) saveRef.current({ title: t });
  }, []);
  const mapTitleRef = useRef(map.title);
  mapTitleRef.current = map.title;
  const currentRef = useRef(current);
  currentRef.current = current;
  const onSaveCurrent = useCallback(() => {
    const setup = currentRef.current;
    if (setup) saveRef.current({ setup });
  }, []);
  const onPresent = useCallback(() => navigate(`/maps/${map.id}/present`), [navigate, map.id]);
  const onVersions = useCallback(() => setVersionsOpen(true), []);
  const onShare = useCallback(() => setShareOpen(true), []);
  const getFigureSvg = useCallback(() => explorerBox.current?.querySelector<SVGSVGElement>('.map-view svg[role="img"]') ?? null, []);

  const onRestoreVersion = (n: number) =>
    restoreVersion.mutate(
      { number: n, expectedVersion: map.version },
      {
        onSuccess: (restored) => {
          reopen(restored);
          message.success(`Version ${n} restored as version ${restored.version}.`);
        },
        onError: (error) => {
          const theirs = conflictOf(error);
          if (theirs && current) setConflict({ theirs, mine: { title: map.title, setup: current } });
          else message.error(error.message);
        },
      },
    );

  const reloadTheirs = () => {
    if (!conflict) return;
    storeMap(queryClient, conflict.theirs);
    reopen(conflict.theirs);
    setConflict(null);
  };
  const keepMineAsCopy = () => {
    if (!conflict) return;
    setCopyError(null);
    saveAsCopy.mutate(
      { mapId: map.id, title: `${conflict.mine.title} (my copy)`.slice(0, 200), setup: conflict.mine.setup },
      {
        onSuccess: (copy) => {
          setConflict(null);
          leaving.current = true;
          message.success(`Your setup is saved as “${copy.title}”.`);
          navigate(`/maps/${copy.id}`);
        },
        onError: (error) => setCopyError(error.message),
      },
    );
  };

  return (
    <div style={{ display: 'flex', flexDirection: 'column' }}>
      <header
        aria-label="Map"
        style={{ height: BAR_HEIGHT, display: 'flex', alignItems: 'center', gap: 12, padding: '0 12px', background: '#fff', borderBottom: `1px solid ${palette.unbound}` }}
      >
        <MapTitle title={map.title} canEdit={canEdit} onRename={onRename} />
        <Typography.Text type="secondary" role="status" aria-live="polite" style={{ fontSize: 12.5, whiteSpace: 'nowrap' }} data-testid="save-state">
          {canEdit ? SAVE_STATE_TEXT[saveState] : 'Read only: you are a viewer of this team'} · version {map.version}
        </Typography.Text>
        <div style={{ flex: 1 }} />
        <div style={{ display: 'flex', alignItems: 'center', gap: 6 }}>
          {pins.headerButton}
          <MapActions
            canEdit={canEdit}
            exportSetup={exportSetup}
            bindingMap={computed?.result ?? null}
            phaseMap={computed?.phase && computed.phaseMotionKey === motionKey(exportSetup) ? computed.phase : null}
            title={map.title}
            saveDisabled={!dirty || current === null || saveState === 'saving'}
            saving={saveState === 'saving'}
            onPresent={onPresent}
            onVersions={onVersions}
            onShare={onShare}
            onSave={onSaveCurrent}
            getFigureSvg={getFigureSvg}
          />
        </div>
      </header>
      <div ref={explorerBox}>
        <ExplorerPage
          key={explorerKey}
          initialSetup={openedWith}
          onSaveSetup={canEdit ? onSaveSetup : undefined}
          saveLabel="Save map"
          speciesCatalogue={explorerSpecies}
          onSetupChange={setCurrent}
          onComputed={setComputed}
          overlay={explorerOverlay}
          style={explorerStyle}
        />
      </div>
      {pins.drawer}
      <UnsavedChangesGuard when={shouldWarn} message="This map has unsaved changes. Leave anyway and lose them?" />
      <OpenedOnce open={!!conflict?.theirs}>
        <ConflictModal
          theirs={conflict?.theirs ?? null}
          onReloadTheirs={reloadTheirs}
          onKeepMineAsCopy={keepMineAsCopy}
          onClose={() => setConflict(null)}
          copying={saveAsCopy.isPending}
          error={copyError}
        />
      </OpenedOnce>
      <OpenedOnce open={versionsOpen}>
        <VersionsDrawer
          mapId={map.id}
          currentVersion={map.version}
          open={versionsOpen}
          onClose={() => setVersionsOpen(false)}
          onRestore={canEdit ? onRestoreVersion : undefined}
          restoring={restoreVersion.isPending ? (restoreVersion.variables?.number ?? null) : null}
        />
      </OpenedOnce>
      {canEdit && (
        <OpenedOnce open={shareOpen}>
          <ShareDialog mapId={map.id} mapTitle={map.title} open={shareOpen} onClose={() => setShareOpen(false)} />
        </OpenedOnce>
      )}
    </div>
  );
}

/** The way back to the maps and the map's title, renamed in place by editors. Memoised: its ellipsis measures the layout on every render. */
const MapTitle = memo(function MapTitle({ title, canEdit, onRename }: { title: string; canEdit: boolean; onRename: (title: string) => void }) {
  return (
    <>
      <Tooltip title="All maps">
        <Link to="/maps" aria-label="All maps">
          <ArrowLeftOutlined />
        </Link>
      </Tooltip>
      <Typography.Title
      level={5}
      style={{ margin: 0, minWidth: 0, maxWidth: 480 }}
      ellipsis={{ tooltip: title }}
      editable={canEdit ? { triggerType: ['icon', 'text'], tooltip: 'Rename', maxLength: 200, onChange: onRename } : false}
    >
      {title}
    </Typography.Title>
    </>
  );
});

interface MapActionsProps {
  canEdit: boolean;
  exportSetup: MapSetup;
  bindingMap: BindingMapResult | null;
  phaseMap: PhaseMapResult | null;
  title: string;
  saveDisabled: boolean;
  saving: boolean;
  onPresent: () => void;
  onVersions: () => void;
  onShare: () => void;
  onSave: () => void;
  getFigureSvg: () => SVGSVGElement | null;
}

/** Present, Versions, Share, Export and Save. Memoised: data arriving for the map (pins, species, live status) does not re-render them. */
const MapActions = memo(function MapActions({ canEdit, exportSetup, bindingMap, phaseMap, title, saveDisabled, saving, onPresent, onVersions, onShare, onSave, getFigureSvg }: MapActionsProps) {
  return (
    <Space size={6}>
      <Tooltip title="Full-screen lecture view of this map">
        <Button size="small" icon={<DesktopOutlined />} onClick={onPresent}>
          Present
        </Button>
      </Tooltip>
      <Button size="small" icon={<HistoryOutlined />} onClick={onVersions}>
        Versions
      </Button>
      {canEdit && (
        <Button size="small" icon={<ShareAltOutlined />} onClick={onShare}>
          Share
        </Button>
      )}
      <ExportMenu setup={exportSetup} bindingMap={bindingMap} phaseMap={phaseMap} title={title} getFigureSvg={getFigureSvg} />
      {canEdit && (
        <Button size="small" type="primary" icon={<SaveOutlined />} disabled={saveDisabled} loading={saving} onClick={onSave}>
          Save
        </Button>
      )}
    </Space>
  );
});
