import { useCallback, useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import type { PinGeometry } from '@fieldbound/shared';
import type { ExplorerOverlayContext, ExplorerRegions } from '../explorer/ExplorerPage';
import { useClassNotices, type PinRegions } from './classNotices';
import { regionUnderPin, type PinRegion } from './pinGeometry';
import { PinsLayer, type LayerPin, type PinTool } from './PinsLayer';
import { shownKey } from '../explorer/viewState';

const NO_REGIONS: ReadonlyMap<string, PinRegion | null> = new Map<string, PinRegion | null>();

const shownKeyOf = (r: ExplorerRegions) => shownKey(r.shown);

/** Reads the classes under the pins from the finished computation and reports them to the owner when they change. */
function PinsOverlay(props: Omit<Parameters<typeof PinsLayer>[0], 'regionsByPin'> & { onRegions: (r: PinRegions | null) => void }) {
  const { ctx, pins, onRegions } = props;
  const regions = ctx.regions;
  const computed = useMemo<PinRegions | null>(
    // Without pins there is nothing to report (the owner keeps null, so a new map result does not re-render it).
    () => (regions && pins.length > 0 ? { byPin: new Map(pins.map((p) => [p.id, regionUnderPin(p.geometry, regions)])), shownKey: shownKeyOf(regions) } : null),
    [pins, regions],
  );
  useEffect(() => onRegions(computed), [computed, onRegions]);
  return <PinsLayer {...props} regionsByPin={computed?.byPin ?? NO_REGIONS} />;
}

export interface PinsOverlayOptions {
  pins: readonly LayerPin[];
  /** Editors: creating and reshaping; absent for viewers and link holders. */
  edit?: {
    onCreate: (geometry: PinGeometry) => void;
    onChangeGeometry: (pinId: string, geometry: PinGeometry) => void;
  };
  large?: boolean;
}

/**
 * State of the pins over one map: selection, the editors' tool, jump requests, the classes under the pins and their
 * change notices; `overlay` goes to the explorer's overlay slot.
 */
export function usePinsOverlay({ pins, edit, large }: PinsOverlayOptions) {
  const [selectedId, setSelectedId] = useState<string | null>(null);
  const [tool, setTool] = useState<PinTool>('none');
  const [jump, setJump] = useState<{ pinId: string; n: number } | null>(null);
  const [regions, setRegions] = useState<PinRegions | null>(null);
  const { notices, acknowledge } = useClassNotices(regions);
  const jumpN = useRef(0);

  const jumpTo = useCallback((pinId: string) => {
    jumpN.current += 1;
    setJump({ pinId, n: jumpN.current });
  }, []);

  const editRef = useRef(edit);
  editRef.current = edit;
  const editable = !!edit;
  const layerEdit = useMemo(
    () =>
      editable
        ? {
            tool,
            onTool: setTool,
            onCreate: (g: PinGeometry) => editRef.current?.onCreate(g),
            onChangeGeometry: (id: string, g: PinGeometry) => editRef.current?.onChangeGeometry(id, g),
          }
        : undefined,
    [editable, tool],
  );

  const overlay = useCallback(
    (ctx: ExplorerOverlayContext): ReactNode => (
      <PinsOverlay ctx={ctx} pins={pins} selectedId={selectedId} onSelect={setSelectedId} notices={notices} edit={layerEdit} jump={jump} large={large} onRegions={setRegions} />
    ),
    [pins, selectedId, notices, layerEdit, jump, large],
  );

  return { overlay, selectedId, select: setSelectedId, tool, setTool, jumpTo, regions, notices, acknowledge };
}
