import { useMemo, useState } from 'react';
import { Alert, App, Button, Empty, Form, Input, Modal, Popconfirm, Space, Table, Tabs, Tag, Tooltip, Typography, Upload } from 'antd';
import { DeleteOutlined, UploadOutlined } from '@ant-design/icons';
import { SPECIES_CSV_COLUMNS, SPECIES_UPLOAD_LIMITS, type CsvIssue, type SpeciesEntry, type SpeciesListView } from '@fieldbound/shared';
import { csvIssuesOf, useDeleteSpeciesList, useSpeciesLists, useTeamSpecies, useUploadSpeciesList } from '../api/species';
import { useCurrentTeam } from '../state/currentTeam';
import { formatDateTime } from '../features/maps/MapBits';
import { ProblemLine } from '../components/ProblemState';

const UNIT_LABEL: Record<string, string> = { 'a0^3': 'a₀³', 'A^3': 'Å³', '1e-24cm^3': '10⁻²⁴ cm³' };

function matches(s: SpeciesEntry, q: string): boolean {
  if (!q) return true;
  const needle = q.toLowerCase();
  return [s.name, s.symbol ?? '', s.list?.name ?? '', s.polarizability.source, s.electronAffinity.source ?? ''].some((t) => t.toLowerCase().includes(needle));
}

/** A number with its unit and uncertainty, as typed when it was entered in another unit. */
function Polarizability({ s }: { s: SpeciesEntry }) {
  const p = s.polarizability;
  const text = `${p.value.toLocaleString('en', { maximumSignificantDigits: 6 })}${p.uncertainty !== null ? ` ± ${p.uncertainty.toLocaleString('en', { maximumSignificantDigits: 3 })}` : ''}`;
  return (
    <span style={{ fontVariantNumeric: 'tabular-nums' }}>
      {text}
      {p.entered && (
        <Typography.Text type="secondary" style={{ fontSize: 12 }}>
          {' '}
          (entered {p.entered.value}
          {p.entered.uncertainty !== null ? ` ± ${p.entered.uncertainty}` : ''} {UNIT_LABEL[p.entered.unit] ?? p.entered.unit})
        </Typography.Text>
      )}
    </span>
  );
}

function Sources({ s }: { s: SpeciesEntry }) {
  const ea = s.electronAffinity;
  return (
    <Space direction="vertical" size={0} style={{ fontSize: 12.5 }}>
      <span>
        α: {s.polarizability.source}
        {s.polarizability.status === 'from memory' && (
          <Tooltip title="Recorded from memory while the catalogue was compiled; check it against the source before relying on it.">
            <Tag color="orange" style={{ marginInlineStart: 6 }}>
              to be checked
            </Tag>
          </Tooltip>
        )}
      </span>
      {ea.source && (
        <span>
          EA: {ea.source}
          {ea.status === 'from memory' && (
            <Tag color="orange" style={{ marginInlineStart: 6 }}>
              to be checked
            </Tag>
          )}
        </span>
      )}
      {ea.note && <Typography.Text type="secondary">{ea.note}</Typography.Text>}
    </Space>
  );
}

function SpeciesTable({ items, loading, showList }: { items: SpeciesEntry[]; loading: boolean; showList: boolean }) {
  return (
    <Table<SpeciesEntry>
      size="small"
      rowKey="id"
      loading={loading}
      dataSource={items}
      pagination={items.length > 100 ? { pageSize: 100, showSizeChanger: false } : false}
      locale={{ emptyText: <Empty image={Empty.PRESENTED_IMAGE_SIMPLE} description="No species match." /> }}
      columns={[
        {
          title: 'Species',
          key: 'name',
          width: 200,
          sorter: (a, b) => a.name.localeCompare(b.name),
          render: (_, s) => (
            <span>
              {s.symbol && <b style={{ marginInlineEnd: 6 }}>{s.symbol}</b>}
              {s.name}
              {s.atomicNumber !== null && <Typography.Text type="secondary" style={{ whiteSpace: 'nowrap' }}> · Z = {s.atomicNumber}</Typography.Text>}
            </span>
          ),
        },
        ...(showList ? [{ title: 'List', key: 'list', render: (_: unknown, s: SpeciesEntry) => s.list?.name ?? '' }] : []),
        { title: 'Polarizability α (a₀³)', key: 'alpha', align: 'right', width: 170, sorter: (a, b) => a.polarizability.value - b.polarizability.value, render: (_, s) => <Polarizability s={s} /> },
        {
          title: 'Field-free anion',
          key: 'ea',
          width: 210,
          render: (_, s) =>
            s.electronAffinity.stableAnion && s.electronAffinity.valueEv !== null ? (
              <span style={{ fontVariantNumeric: 'tabular-nums' }}>
                yes · EA {s.electronAffinity.valueEv} eV{s.electronAffinity.uncertaintyEv !== null ? ` ± ${s.electronAffinity.uncertaintyEv}` : ''}
              </span>
            ) : (
              <Typography.Text type="secondary">none</Typography.Text>
            ),
        },
        { title: 'Mass number', dataIndex: 'massNumber', align: 'right' },
        { title: 'Sources', key: 'sources', render: (_, s) => <Sources s={s} /> },
      ]}
    />
  );
}

/** Upload of a species list CSV; a rejected file lists every problem by line and column, and nothing is imported. */
export function SpeciesUpload({ teamId, open, onClose }: { teamId: string; open: boolean; onClose: () => void }) {
  const [form] = Form.useForm<{ name: string }>();
  const upload = useUploadSpeciesList(teamId);
  const [file, setFile] = useState<File | null>(null);
  const [issues, setIssues] = useState<CsvIssue[] | null>(null);
  const [error, setError] = useState<string | null>(null);
  const { message } = App.useApp();

  const submit = ({ name }: { name: string }) => {
    setIssues(null);
    setError(null);
    if (!file) {
      setError('Choose a CSV file.');
      return;
    }
    upload.mutate(
      { name: name.trim(), file },
      {
        onSuccess: (list) => {
          message.success(`${list.speciesCount} species imported into “${list.name}”.`);
          form.resetFields();
          setFile(null);
          onClose();
        },
        onError: (e) => {
          const found = csvIssuesOf(e);
          if (found) setIssues(found);
          setError(found ? `${e.message} Nothing was imported.` : e.message);
        },
      },
    );
  };

  return (
    <Modal title="Upload a species list" open={open} onCancel={onClose} okText="Upload" onOk={() => form.submit()} confirmLoading={upload.isPending} width={720} destroyOnHidden>
      <Typography.Paragraph type="secondary">
        A UTF-8 CSV file (at most {SPECIES_UPLOAD_LIMITS.maxBytes / 1024} KB, {SPECIES_UPLOAD_LIMITS.maxRows} species) with a header row naming the columns{' '}
        <code>{SPECIES_CSV_COLUMNS.join(',')}</code>. Units: <code>a0^3</code>, <code>A^3</code> or <code>1e-24cm^3</code>; leave the electron affinity empty for an atom without a stable
        negative ion.
      </Typography.Paragraph>
      <Form form={form} layout="vertical" onFinish={submit} requiredMark={false}>
        <Form.Item name="name" label="Name of the list" rules={[{ required: true, whitespace: true, message: 'Name the list.' }, { max: SPECIES_UPLOAD_LIMITS.maxListNameLength }]}>
          <Input placeholder="e.g. Rare earths, our calculations" />
        </Form.Item>
        <Form.Item label="CSV file">
          <Upload
            accept=".csv,text/csv"
            maxCount={1}
            beforeUpload={(f) => {
              setFile(f);
              setIssues(null);
              return false;
            }}
            onRemove={() => setFile(null)}
            fileList={file ? [{ uid: 'csv', name: file.name, status: 'done' }] : []}
          >
            <Button icon={<UploadOutlined />}>Choose a CSV file…</Button>
          </Upload>
        </Form.Item>
      </Form>
      {error && <Alert type="error" showIcon message={error} style={{ marginBottom: 12 }} />}
      {issues && issues.length > 0 && (
        <Table<CsvIssue>
          size="small"
          aria-label="Problems in the file"
          rowKey={(i, n) => `${i.line}-${i.column}-${n}`}
          dataSource={issues}
          pagination={issues.length > 20 ? { pageSize: 20, showSizeChanger: false } : false}
          columns={[
            { title: 'Line', key: 'line', width: 70, render: (_, i) => i.line ?? '—' },
            { title: 'Column', key: 'column', width: 170, render: (_, i) => (i.column ? <code>{i.column}</code> : 'whole line') },
            { title: 'Problem', dataIndex: 'message' },
          ]}
        />
      )}
    </Modal>
  );
}

function ListsTable({ teamId, canEdit }: { teamId: string; canEdit: boolean }) {
  const lists = useSpeciesLists(teamId);
  const remove = useDeleteSpeciesList(teamId);
  const { message } = App.useApp();
  return (
    <Table<SpeciesListView>
      size="small"
      rowKey="id"
      loading={lists.isLoading}
      dataSource={lists.data ?? []}
      pagination={false}
      locale={{ emptyText: <Empty image={Empty.PRESENTED_IMAGE_SIMPLE} description={canEdit ? 'No species lists yet. Upload a CSV file to add your own atoms.' : 'No species lists yet.'} /> }}
      columns={[
        { title: 'List', dataIndex: 'name' },
        { title: 'Species', dataIndex: 'speciesCount', align: 'right' },
        { title: 'File', key: 'file', render: (_, l) => l.fileName ?? '—' },
        { title: 'Uploaded', key: 'created', render: (_, l) => `${formatDateTime(l.createdAt)}${l.createdBy ? ` by ${l.createdBy.displayName}` : ''}` },
        ...(canEdit
          ? [
              {
                title: '',
                key: 'delete',
                align: 'right' as const,
                render: (_: unknown, l: SpeciesListView) => (
                  <Popconfirm title={`Delete the list “${l.name}”?`} description="Maps that show its species in the overlay will no longer find them." okText="Delete" okButtonProps={{ danger: true }} onConfirm={() => remove.mutateAsync(l.id).catch((e: Error) => message.error(e.message))}>
                    <Button size="small" type="text" danger icon={<DeleteOutlined />} aria-label={`Delete ${l.name}`} />
                  </Popconfirm>
                ),
              },
            ]
          : []),
      ]}
    />
  );
}

/** The built-in catalogue and the team's own species lists, with CSV upload for editors. */
export function SpeciesPage() {
  const { team } = useCurrentTeam();
  const teamId = team?.id ?? null;
  const canEdit = team?.role === 'editor' || team?.role === 'owner';
  const species = useTeamSpecies(teamId);
  const [search, setSearch] = useState('');
  const [uploadOpen, setUploadOpen] = useState(false);
  const all = species.data ?? [];
  const catalogue = useMemo(() => all.filter((s) => s.origin === 'catalogue' && matches(s, search.trim())), [all, search]);
  const own = useMemo(() => all.filter((s) => s.origin === 'team' && matches(s, search.trim())), [all, search]);
  if (!team || !teamId) return null;

  return (
    <div style={{ padding: '20px 24px', maxWidth: 1200, width: '100%', margin: '0 auto' }}>
      <Space style={{ width: '100%', justifyContent: 'space-between', marginBottom: 12 }} wrap>
        <div>
          <Typography.Title level={3} style={{ margin: 0 }}>
            Species
          </Typography.Title>
          <Typography.Text type="secondary">Atoms a map can mark at their polarizability: the built-in catalogue and {team.name}'s species lists. Every value shows its source.</Typography.Text>
        </div>
        {canEdit && (
          <Button type="primary" icon={<UploadOutlined />} onClick={() => setUploadOpen(true)}>
            Upload a species list…
          </Button>
        )}
      </Space>
      <Input.Search allowClear aria-label="Search species" placeholder="Search names, symbols and sources" value={search} onChange={(e) => setSearch(e.target.value)} style={{ maxWidth: 360, marginBottom: 12 }} />
      {species.isError && <Alert type="error" showIcon message={<ProblemLine error={species.error} what="the species" onRetry={() => species.refetch()} />} style={{ marginBottom: 12 }} />}
      <Tabs
        items={[
          { key: 'catalogue', label: `Catalogue (${catalogue.length})`, children: <SpeciesTable items={catalogue} loading={species.isLoading} showList={false} /> },
          {
            key: 'team',
            label: `Team species (${own.length})`,
            children: (
              <Space direction="vertical" style={{ width: '100%' }} size="large">
                <ListsTable teamId={teamId} canEdit={canEdit} />
                <SpeciesTable items={own} loading={species.isLoading} showList />
              </Space>
            ),
          },
        ]}
      />
      {canEdit && <SpeciesUpload teamId={teamId} open={uploadOpen} onClose={() => setUploadOpen(false)} />}
    </div>
  );
}
