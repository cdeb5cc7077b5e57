import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { App, Button, Dropdown, Empty, Input, Space, Table, Tag, Typography, type TableProps } from 'antd';
import { CopyOutlined, DeleteOutlined, EllipsisOutlined, ImportOutlined, PlusOutlined, RestOutlined } from '@ant-design/icons';
import { Link, useNavigate } from 'react-router-dom';
import type { MapListItem, MapSetup, MapSortKey } from '@fieldbound/shared';
import { useDeleteMap, useDeletedMaps, useMapList, useRestoreMap } from '../api/maps';
import { useCurrentTeam } from '../state/currentTeam';
import { ImportSetupDialog } from '../features/export';
import { CreateMapModal } from '../features/maps/CreateMapModal';
import { DuplicateMapModal } from '../features/maps/DuplicateMapModal';
import { ProblemLine } from '../components/ProblemState';
import { MapThumbnail, SummaryCounts, formatDateTime, personName } from '../features/maps/MapBits';

/** Seconds a deleted map stays in the list's "Undo" notice before the delete is sent. */
export const UNDO_DELETE_MS = 6000;

function useDebounced<T>(value: T, ms: number): T {
  const [debounced, setDebounced] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setDebounced(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return debounced;
}

/**
 * Deleting with undo, for every role that may delete: the row leaves the list at once, the notice offers "Undo" for a
 * few seconds, and only then is the map moved to the bin. Leaving the page sends the pending deletes at once.
 */
function useUndoableDelete(teamId: string) {
  const { notification } = App.useApp();
  const remove = useDeleteMap(teamId);
  const [hidden, setHidden] = useState<ReadonlySet<string>>(new Set());
  const timers = useRef(new Map<string, ReturnType<typeof setTimeout>>());
  const removeRef = useRef(remove.mutate);
  removeRef.current = remove.mutate;

  const commit = useCallback((mapId: string) => {
    timers.current.delete(mapId);
    removeRef.current(mapId, {
      onError: (error) => {
        setHidden((h) => new Set([...h].filter((id) => id !== mapId)));
        notification.error({ message: 'The map was not deleted', description: error.message });
      },
    });
  }, [notification]);

  useEffect(() => {
    const pending = timers.current;
    return () => {
      for (const [mapId, timer] of pending) {
        clearTimeout(timer);
        removeRef.current(mapId);
      }
      pending.clear();
    };
  }, []);

  const start = (map: MapListItem) => {
    setHidden((h) => new Set(h).add(map.id));
    const key = `delete-${map.id}`;
    timers.current.set(map.id, setTimeout(() => { notification.destroy(key); commit(map.id); }, UNDO_DELETE_MS));
    notification.info({
      key,
      message: `“${map.title}” moved to the bin`,
      description: 'Owners can restore it for 30 days from Recently deleted.',
      duration: UNDO_DELETE_MS / 1000,
      btn: (
        <Button
          size="small"
          onClick={() => {
            clearTimeout(timers.current.get(map.id));
            timers.current.delete(map.id);
            setHidden((h) => new Set([...h].filter((id) => id !== map.id)));
            notification.destroy(key);
          }}
        >
          Undo
        </Button>
      ),
    });
  };
  return { hidden, start };
}

function DeletedMaps({ teamId }: { teamId: string }) {
  const { message } = App.useApp();
  const deleted = useDeletedMaps(teamId, true);
  const restore = useRestoreMap(teamId);
  return (
    <section aria-label="Recently deleted" style={{ marginTop: 24 }}>
      <Typography.Title level={5}>Recently deleted</Typography.Title>
      <Typography.Paragraph type="secondary">Deleted maps can be restored by an owner for 30 days; after that they are removed for good.</Typography.Paragraph>
      <Table
        size="small"
        rowKey="id"
        loading={deleted.isLoading}
        dataSource={deleted.data ?? []}
        pagination={false}
        locale={{ emptyText: <Empty image={Empty.PRESENTED_IMAGE_SIMPLE} description="Nothing in the bin." /> }}
        columns={[
          { title: 'Title', dataIndex: 'title' },
          { title: 'Deleted', key: 'deleted', render: (_, d) => `${formatDateTime(d.deletedAt)} by ${personName(d.deletedBy)}` },
          { title: 'Restorable until', key: 'until', render: (_, d) => formatDateTime(d.restorableUntil) },
          {
            title: '',
            key: 'actions',
            align: 'right',
            render: (_, d) => (
              <Button
                size="small"
                icon={<RestOutlined />}
                loading={restore.isPending && restore.variables === d.id}
                onClick={() => restore.mutate(d.id, { onSuccess: (map) => message.success(`“${map.title}” is back in the list.`), onError: (e) => message.error(e.message) })}
              >
                Restore
              </Button>
            ),
          },
        ]}
      />
    </section>
  );
}

/** The team's maps: a searchable, sortable table with create, import, duplicate and delete for those who may. */
export function MapsPage() {
  const { team, teams } = useCurrentTeam();
  const navigate = useNavigate();
  const teamId = team?.id ?? '';
  const canEdit = team?.role === 'editor' || team?.role === 'owner';
  const isOwner = team?.role === 'owner';
  const canDuplicate = teams.some((t) => t.role === 'editor' || t.role === 'owner');

  const [search, setSearch] = useState('');
  const debouncedSearch = useDebounced(search.trim(), 250);
  const [sort, setSort] = useState<{ key: MapSortKey; order: 'asc' | 'desc' }>({ key: 'updatedAt', order: 'desc' });
  const list = useMapList(teamId, { search: debouncedSearch, sort: sort.key, order: sort.order });
  const { hidden, start: deleteWithUndo } = useUndoableDelete(teamId);

  const [createOpen, setCreateOpen] = useState(false);
  const [importOpen, setImportOpen] = useState(false);
  const [imported, setImported] = useState<MapSetup | null>(null);
  const [duplicating, setDuplicating] = useState<MapListItem | null>(null);
  const [showDeleted, setShowDeleted] = useState(false);
  const { message } = App.useApp();

  const rows = useMemo(() => (list.data?.items ?? []).filter((m) => !hidden.has(m.id)), [list.data, hidden]);
  const noMapsAtAll = !list.isLoading && !debouncedSearch && rows.length === 0 && !list.isError;

  const columns: TableProps<MapListItem>['columns'] = [
    { title: '', key: 'thumb', width: 96, render: (_, m) => <Link to={`/maps/${m.id}`} tabIndex={-1}><MapThumbnail url={m.thumbnailUrl} title={m.title} /></Link> },
    {
      title: 'Title',
      key: 'title',
      sorter: true,
      sortOrder: sort.key === 'title' ? (sort.order === 'asc' ? 'ascend' : 'descend') : null,
      render: (_, m) => (
        <Space direction="vertical" size={2}>
          <Link to={`/maps/${m.id}`} style={{ fontWeight: 500 }}>
            {m.title}
          </Link>
          {m.tags.length > 0 && (
            <span>
              {m.tags.map((t) => (
                <Tag key={t} style={{ marginInlineEnd: 4 }} onClick={() => setSearch(t)}>
                  {t}
                </Tag>
              ))}
            </span>
          )}
        </Space>
      ),
    },
    {
      title: 'Updated',
      key: 'updatedAt',
      sorter: true,
      sortOrder: sort.key === 'updatedAt' ? (sort.order === 'asc' ? 'ascend' : 'descend') : null,
      render: (_, m) => (
        <Space direction="vertical" size={0}>
          <span style={{ fontVariantNumeric: 'tabular-nums' }}>{formatDateTime(m.updatedAt)}</span>
          <Typography.Text type="secondary" style={{ fontSize: 12 }}>
            by {personName(m.updatedBy)} · version {m.version}
          </Typography.Text>
        </Space>
      ),
    },
    { title: 'Last computation', key: 'summary', render: (_, m) => <SummaryCounts summary={m.summary} /> },
    {
      title: '',
      key: 'actions',
      align: 'right',
      width: 56,
      render: (_, m) => {
        const items = [
          ...(canDuplicate ? [{ key: 'duplicate', icon: <CopyOutlined />, label: 'Duplicate…' }] : []),
          ...(canEdit ? [{ key: 'delete', icon: <DeleteOutlined />, label: 'Delete', danger: true }] : []),
        ];
        if (!items.length) return null;
        return (
          <Dropdown
            trigger={['click']}
            menu={{ items, onClick: ({ key }) => (key === 'duplicate' ? setDuplicating(m) : deleteWithUndo(m)) }}
          >
            <Button type="text" aria-label={`Actions for ${m.title}`} icon={<EllipsisOutlined />} />
          </Dropdown>
        );
      },
    },
  ];

  if (!team) return null;
  return (
    <div style={{ padding: '20px 24px', maxWidth: 1200, width: '100%', margin: '0 auto' }}>
      <Space style={{ width: '100%', justifyContent: 'space-between', marginBottom: 12 }} wrap>
        <div>
          <Typography.Title level={3} style={{ margin: 0 }}>
            Maps
          </Typography.Title>
          <Typography.Text type="secondary">
            {team.name} · {list.data ? `${list.data.total} map${list.data.total === 1 ? '' : 's'}` : ' '} · <Link to="/species">Species</Link>
          </Typography.Text>
        </div>
        <Space wrap>
          {isOwner && (
            <Button type={showDeleted ? 'default' : 'text'} icon={<RestOutlined />} onClick={() => setShowDeleted((v) => !v)} aria-pressed={showDeleted}>
              Recently deleted
            </Button>
          )}
          {canEdit && (
            <>
              <Button icon={<ImportOutlined />} onClick={() => setImportOpen(true)}>
                Import a setup…
              </Button>
              <Button type="primary" icon={<PlusOutlined />} onClick={() => setCreateOpen(true)}>
                New map
              </Button>
            </>
          )}
        </Space>
      </Space>

      <Input.Search
        allowClear
        aria-label="Search maps"
        placeholder="Search titles and tags"
        value={search}
        onChange={(e) => setSearch(e.target.value)}
        style={{ maxWidth: 360, marginBottom: 12 }}
        loading={list.isFetching && !!debouncedSearch}
      />

      <Table<MapListItem>
        rowKey="id"
        columns={columns}
        dataSource={rows}
        loading={list.isLoading}
        pagination={rows.length > 50 ? { pageSize: 50, showSizeChanger: false } : false}
        onChange={(_p, _f, sorter) => {
          const s = Array.isArray(sorter) ? sorter[0] : sorter;
          if (!s?.order) setSort({ key: 'updatedAt', order: 'desc' });
          else setSort({ key: s.columnKey as MapSortKey, order: s.order === 'ascend' ? 'asc' : 'desc' });
        }}
        locale={{
          emptyText: list.isError ? (
            <Empty image={Empty.PRESENTED_IMAGE_SIMPLE} description={<ProblemLine error={list.error} what="the maps" onRetry={() => list.refetch()} />} />
          ) : noMapsAtAll ? (
            <Empty
              image={Empty.PRESENTED_IMAGE_SIMPLE}
              description={
                <Space direction="vertical" size={2}>
                  <Typography.Text strong>No maps in {team.name} yet</Typography.Text>
                  <Typography.Text type="secondary">
                    A map scans polarizability against magnetic field and shows where field-induced negative ions are bound, resonant or unbound.
                    {canEdit ? ' Start from a preset regime or import a setup file.' : ' Editors of the team can create one.'}
                  </Typography.Text>
                </Space>
              }
            >
              {canEdit && (
                <Button type="primary" icon={<PlusOutlined />} onClick={() => setCreateOpen(true)}>
                  New map
                </Button>
              )}
            </Empty>
          ) : (
            <Empty image={Empty.PRESENTED_IMAGE_SIMPLE} description={`No map matches “${debouncedSearch}”.`} />
          ),
        }}
      />

      {isOwner && showDeleted && <DeletedMaps teamId={teamId} />}

      {canEdit && (createOpen || imported) && (
        <CreateMapModal
          key={imported ? 'imported' : 'new'}
          teamId={teamId}
          open
          importedSetup={imported}
          onClose={() => {
            setCreateOpen(false);
            setImported(null);
          }}
          onCreated={(map) => {
            setCreateOpen(false);
            setImported(null);
            navigate(`/maps/${map.id}`);
          }}
        />
      )}
      <ImportSetupDialog
        open={importOpen}
        onClose={() => setImportOpen(false)}
        onImport={(setup) => {
          setImportOpen(false);
          setImported(setup);
        }}
      />
      <DuplicateMapModal
        map={duplicating}
        onClose={() => setDuplicating(null)}
        onDuplicated={(copy) => {
          setDuplicating(null);
          const into = teams.find((t) => t.id === copy.teamId);
          message.success(into && into.id !== teamId ? `Copied into ${into.name}.` : `“${copy.title}” created.`);
        }}
      />
    </div>
  );
}
