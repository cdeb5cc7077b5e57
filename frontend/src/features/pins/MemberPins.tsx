import { useCallback, useMemo, useState } from 'react';
import { Alert, App, Badge, Button, Drawer, Space, Tooltip, Typography } from 'antd';
import { ArrowLeftOutlined, PushpinOutlined } from '@ant-design/icons';
import { useQueryClient } from '@tanstack/react-query';
import type { PinGeometry, PinView } from '@fieldbound/shared';
import { useLiveMap, type LiveStatus } from '../../api/live';
import { pinConflictOf, pinKeys, useCreatePin, usePins, useUpdatePin } from '../../api/pins';
import { applyServerErrors } from '../../components/forms';
import { OpenedOnce } from '../../components/OpenedOnce';
import { palette } from '../../theme/palette';
import { CreatePinModal } from './CreatePinModal';
import { describeRegion } from './pinGeometry';
import { PinsTable, type PinRow } from './PinsTable';
import { PinThread } from './PinThread';
import { usePinsOverlay } from './usePinsOverlay';

const NO_PINS: PinView[] = [];

const LIVE_TEXT: Record<LiveStatus, string> = {
  connecting: 'Connecting for live updates…',
  live: 'Live: changes by others appear here as they happen',
  reconnecting: 'Live updates interrupted; reconnecting…',
  closed: 'Live updates are not available',
};

export function LiveBadge({ status }: { status: LiveStatus }) {
  const color = status === 'live' ? 'green' : status === 'closed' ? 'red' : 'gold';
  return (
    <Tooltip title={LIVE_TEXT[status]}>
      <span data-testid="live-status" data-status={status} style={{ fontSize: 12, color: '#5b5d70', whiteSpace: 'nowrap' }}>
        <Badge color={color} /> {status === 'live' ? 'Live' : status === 'closed' ? 'Offline' : 'Connecting'}
      </span>
    </Tooltip>
  );
}

/**
 * Pins of a map for its team's members: the overlay for the explorer, a header button, the drawer with the list and
 * the threads, and live updates. Editors draw, move and reshape pins; viewers read and reply.
 */
export function useMemberPins({ mapId, mapVersion, canEdit }: { mapId: string; mapVersion: number; canEdit: boolean }) {
  const pins = usePins(mapId);
  const live = useLiveMap(mapId, mapVersion);
  const create = useCreatePin(mapId);
  const update = useUpdatePin();
  const queryClient = useQueryClient();
  const { message, modal } = App.useApp();
  const [listOpen, setListOpen] = useState(false);
  const [creating, setCreating] = useState<PinGeometry | null>(null);

  const list = pins.data ?? NO_PINS;
  const categories = useMemo(() => [...new Set(list.map((p) => p.category).filter((c): c is string => !!c))].sort(), [list]);

  const changeGeometry = useCallback(
    (pinId: string, geometry: PinGeometry) => {
      const before = queryClient.getQueryData<PinView[]>(pinKeys.list(mapId))?.find((p) => p.id === pinId);
      if (!before) return;
      // Shown at its new place at once; put back if the server refuses.
      queryClient.setQueryData<PinView[]>(pinKeys.list(mapId), (l) => l?.map((p) => (p.id === pinId ? { ...p, geometry } : p)));
      const save = (expectedVersion: number) =>
        update.mutate(
          { pinId, expectedVersion, geometry },
          {
            onError: (error) => {
              const current = pinConflictOf(error);
              if (!current) {
                queryClient.setQueryData<PinView[]>(pinKeys.list(mapId), (l) => l?.map((p) => (p.id === pinId ? { ...p, geometry: before.geometry } : p)));
                message.error(`The pin was not moved: ${error.message}`);
                return;
              }
              // The current pin is in the cache now (shown where the other person left it).
              modal.confirm({
                title: 'Someone changed this pin meanwhile',
                content: `“${current.title}” was changed (now version ${current.version}) while you moved it. The map shows it as it is now. Move it to your place anyway?`,
                okText: 'Move it to my place',
                cancelText: 'Keep theirs',
                onOk: () => {
                  queryClient.setQueryData<PinView[]>(pinKeys.list(mapId), (l) => l?.map((p) => (p.id === pinId ? { ...p, geometry } : p)));
                  save(current.version);
                },
              });
            },
          },
        );
      save(before.version);
    },
    [mapId, queryClient, update, message, modal],
  );

  const edit = useMemo(() => (canEdit ? { onCreate: setCreating, onChangeGeometry: changeGeometry } : undefined), [canEdit, changeGeometry]);
  const layer = usePinsOverlay({ pins: list, edit });
  const { selectedId, select, jumpTo, regions, notices, acknowledge } = layer;

  const rows: PinRow[] = useMemo(
    () =>
      list.map((p) => ({
        id: p.id,
        title: p.title,
        status: p.status,
        category: p.category,
        replyCount: p.replyCount,
        updatedAt: p.updatedAt,
        region: regions ? describeRegion(regions.byPin.get(p.id) ?? null) : null,
        notice: notices.get(p.id),
      })),
    [list, regions, notices],
  );

  const open = listOpen || selectedId !== null;
  const selectedRegion = selectedId && regions ? describeRegion(regions.byPin.get(selectedId) ?? null) : null;

  const headerButton = (
    <Space size={8}>
      <LiveBadge status={live.status} />
      <Button size="small" icon={<PushpinOutlined />} onClick={() => setListOpen(true)} aria-label={`Pins (${list.length})`}>
        Pins {list.length > 0 ? `(${list.length})` : ''}
      </Button>
    </Space>
  );

  const drawer = (
    <>
      {live.savedVersion && (
        <Alert
          banner
          type="info"
          style={{ position: 'fixed', bottom: 16, left: '50%', transform: 'translateX(-50%)', zIndex: 900, width: 'auto', boxShadow: '0 2px 8px rgba(43,45,66,0.2)' }}
          title={`${live.savedVersion.by ?? 'Someone'} saved version ${live.savedVersion.version} of this map.`}
          action={
            <Button size="small" onClick={() => window.location.reload()}>
              Open the new version
            </Button>
          }
        />
      )}
      <OpenedOnce open={open}>
        <Drawer
          title={
            <Space>
              <PushpinOutlined style={{ color: palette.pin }} /> Pins
            </Space>
          }
          placement="right"
          size={440}
          open={open}
          mask={false}
          onClose={() => {
            setListOpen(false);
            select(null);
          }}
        >
          {selectedId ? (
            <>
              <Button type="link" icon={<ArrowLeftOutlined />} style={{ padding: 0, marginBottom: 8 }} onClick={() => {
                setListOpen(true);
                select(null);
              }}>
                All pins
              </Button>
              <PinThread
                key={selectedId}
                mapId={mapId}
                pinId={selectedId}
                canEdit={canEdit}
                regionText={selectedRegion}
                notice={notices.get(selectedId)}
                onAcknowledge={() => acknowledge(selectedId)}
                onJump={() => jumpTo(selectedId)}
                onDeleted={() => select(null)}
                categories={categories}
              />
            </>
          ) : (
            <>
              {canEdit && (
                <Typography.Paragraph type="secondary" style={{ fontSize: 12.5 }}>
                  To add a pin, pick a tool at the top left of the map: a point, a rectangle or a polygon.
                </Typography.Paragraph>
              )}
              {pins.isError && <Alert type="error" title={`The pins could not be loaded: ${pins.error.message}`} />}
              <PinsTable rows={rows} onOpen={select} onJump={jumpTo} />
            </>
          )}
        </Drawer>
      </OpenedOnce>
      <OpenedOnce open={creating !== null}>
        <CreatePinModal
          geometry={creating}
          categories={categories}
          saving={create.isPending}
          onCancel={() => setCreating(null)}
          onSubmit={(request, form) =>
            create.mutate(request, {
              onSuccess: (pin) => {
                setCreating(null);
                select(pin.id);
              },
              onError: (error) => {
                const text = applyServerErrors(form, error, ['title', 'body', 'category']);
                if (text) message.error(`The pin was not added: ${text}`);
              },
            })
          }
        />
      </OpenedOnce>
    </>
  );

  return { overlay: layer.overlay, headerButton, drawer, pins: list, select, jumpTo, liveStatus: live.status };
}
