import { useState } from 'react';
import { Alert, Button, Form, Input, Modal, Radio, Select, Space, Typography } from 'antd';
import { UploadOutlined } from '@ant-design/icons';
import { MAP_LIMITS, SETUP_PRESETS, applyPreset, defaultSetup, type MapDetail, type MapSetup } from '@fieldbound/shared';
import { useCreateMap } from '../../api/maps';
import { applyServerErrors } from '../../components/forms';
import { MagnetSafetyNote } from '../../components/MagnetSafetyNote';
import { ImportSetupDialog } from '../export';
import { formatScientific } from '../map-render/formatNumber';

interface Values {
  title: string;
  tags?: string[];
  source: 'preset' | 'import';
  preset: string;
}

export interface CreateMapModalProps {
  teamId: string;
  open: boolean;
  onClose: () => void;
  onCreated: (map: MapDetail) => void;
  /** Open with an imported setup already chosen (the list's "Import a setup"). */
  importedSetup?: MapSetup | null;
}

/** A new map: a title, optional tags, and a setup from a preset regime or an imported JSON file. */
export function CreateMapModal({ teamId, open, onClose, onCreated, importedSetup = null }: CreateMapModalProps) {
  const [form] = Form.useForm<Values>();
  const create = useCreateMap(teamId);
  const [imported, setImported] = useState<MapSetup | null>(importedSetup);
  const [importOpen, setImportOpen] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const source = Form.useWatch('source', form) ?? (importedSetup ? 'import' : 'preset');
  const presetId = Form.useWatch('preset', form) ?? SETUP_PRESETS[0].id;

  const submit = async (values: Values) => {
    setError(null);
    let setup: MapSetup;
    if (values.source === 'import') {
      if (!imported) {
        setError('Choose a setup file first.');
        return;
      }
      setup = imported;
    } else {
      const preset = SETUP_PRESETS.find((p) => p.id === values.preset) ?? SETUP_PRESETS[0];
      setup = applyPreset(defaultSetup(), preset);
    }
    try {
      const map = await create.mutateAsync({ title: values.title, tags: values.tags ?? [], setup });
      form.resetFields();
      setImported(null);
      onCreated(map);
    } catch (e) {
      setError(applyServerErrors(form, e, ['title', 'tags']));
    }
  };

  return (
    <Modal
      title="New map"
      open={open}
      onCancel={onClose}
      okText="Create map"
      onOk={() => form.submit()}
      confirmLoading={create.isPending}
      destroyOnHidden
      afterOpenChange={(visible) => visible && importedSetup && setImported(importedSetup)}
    >
      <Form form={form} layout="vertical" onFinish={submit} initialValues={{ source: importedSetup ? 'import' : 'preset', preset: SETUP_PRESETS[0].id, tags: [] }} requiredMark={false}>
        <Form.Item
          name="title"
          label="Title"
          rules={[
            { required: true, whitespace: true, message: 'Give the map a title.' },
            { max: MAP_LIMITS.maxTitleLength, message: `A title has at most ${MAP_LIMITS.maxTitleLength} characters.` },
          ]}
        >
          <Input autoFocus placeholder="e.g. Alkali atoms in laboratory fields" />
        </Form.Item>
        <Form.Item name="tags" label="Tags" extra="Words to find the map by; press Enter after each.">
          <Select mode="tags" open={false} suffixIcon={null} aria-label="Tags" placeholder="optional" maxCount={MAP_LIMITS.maxTags} />
        </Form.Item>
        <Form.Item name="source" label="Start from">
          <Radio.Group>
            <Radio value="preset">A preset regime</Radio>
            <Radio value="import">An imported setup (JSON)</Radio>
          </Radio.Group>
        </Form.Item>
        {source === 'preset' ? (
          <Form.Item name="preset" label="Regime" extra={SETUP_PRESETS.find((p) => p.id === presetId)?.description}>
            <Select aria-label="Regime" options={SETUP_PRESETS.map((p) => ({ value: p.id, label: p.title }))} />
          </Form.Item>
        ) : null}
        {source === 'preset' && (presetId === 'laboratory' || presetId === 'pulsed') ? (
          <div style={{ marginBottom: 16 }}>
            <MagnetSafetyNote compact />
          </div>
        ) : null}
        {source === 'preset' ? null : (
          <Form.Item label="Setup file">
            <Space direction="vertical" style={{ width: '100%' }}>
              <Button icon={<UploadOutlined />} onClick={() => setImportOpen(true)}>
                {imported ? 'Choose another file…' : 'Choose a setup file…'}
              </Button>
              {imported && (
                <Typography.Text type="secondary">
                  Imported: α {formatScientific(imported.alphaAxis.min)}–{formatScientific(imported.alphaAxis.max)} a₀³, B {formatScientific(imported.fieldAxis.min)}–{formatScientific(imported.fieldAxis.max)} T, {imported.grid.nAlpha} × {imported.grid.nField} grid.
                </Typography.Text>
              )}
            </Space>
          </Form.Item>
        )}
        {error && <Alert type="error" showIcon message={error} />}
      </Form>
      <ImportSetupDialog
        open={importOpen}
        onClose={() => setImportOpen(false)}
        onImport={(setup) => {
          setImported(setup);
          setImportOpen(false);
        }}
      />
    </Modal>
  );
}
