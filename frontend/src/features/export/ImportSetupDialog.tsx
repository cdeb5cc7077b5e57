import { useState } from 'react';
import { Alert, Button, Input, Modal, Space, Typography } from 'antd';
import { UploadOutlined } from '@ant-design/icons';
import { ENGINE_VERSION, importFileText, importMapJson, type ImportedMap, type ImportProblem, type MapSetup } from '@fieldbound/shared';

/** Largest file the dialog reads (a map file with results can be large; the setup alone is a few kB). */
export const IMPORT_MAX_BYTES = 300 * 1024 * 1024;

export interface ImportSetupDialogProps {
  open: boolean;
  onClose: () => void;
  /** Called once with the validated setup (and the whole import, results included when the file had them). */
  onImport: (setup: MapSetup, imported: ImportedMap) => void;
}

/**
 * Import of a setup from a JSON file written by the export (or a bare setup), or from an exported PNG
 * or SVG figure (which records its setup), chosen as a file or pasted. Validated with the same rules as the server before anything happens; every problem is listed
 * with where it is. `onImport` is called only for a valid setup.
 */
export function ImportSetupDialog({ open, onClose, onImport }: ImportSetupDialogProps) {
  const [text, setText] = useState('');
  const [source, setSource] = useState<string | null>(null);
  const [problems, setProblems] = useState<ImportProblem[]>([]);
  const [warnings, setWarnings] = useState<string[]>([]);
  const [busy, setBusy] = useState(false);

  const reset = () => {
    setProblems([]);
    setWarnings([]);
  };

  const readFile = async (file: File) => {
    reset();
    if (file.size > IMPORT_MAX_BYTES) {
      setProblems([{ path: '(file)', message: `${file.name} is ${Math.round(file.size / 1e6)} MB, above the ${Math.round(IMPORT_MAX_BYTES / 1e6)} MB this dialog reads` }]);
      return;
    }
    setBusy(true);
    try {
      const found = importFileText(new Uint8Array(await file.arrayBuffer()));
      setSource(found.kind === 'json' ? file.name : `${file.name} (the setup recorded in the figure)`);
      if (found.text === null) {
        setText('');
        setProblems([{ path: '(file)', message: found.message }]);
        return;
      }
      setText(found.text.length > 200_000 ? '' : found.text);
      runImport(found.text);
    } catch (e) {
      setProblems([{ path: '(file)', message: `could not read ${file.name}: ${(e as Error).message}` }]);
    } finally {
      setBusy(false);
    }
  };

  const runImport = (content: string) => {
    reset();
    const r = importMapJson(content, { currentEngineVersion: ENGINE_VERSION });
    if (!r.ok) {
      setProblems(r.problems);
      return;
    }
    setWarnings(r.value.warnings);
    onImport(r.value.setup, r.value);
  };

  return (
    <Modal
      open={open}
      onCancel={onClose}
      title="Import a setup"
      width={720}
      destroyOnHidden
      footer={
        <Space>
          <Button onClick={onClose}>Cancel</Button>
          <Button type="primary" disabled={text.trim() === ''} loading={busy} onClick={() => runImport(text)}>
            Import
          </Button>
        </Space>
      }
    >
      <Typography.Paragraph type="secondary">
        Choose a JSON file exported from a map (setup and results), a setup on its own, or a PNG or SVG figure exported from a map (its setup is recorded in the file), or paste JSON text. It is checked with the same rules as the server before a map is created.
      </Typography.Paragraph>
      <Space style={{ marginBottom: 12 }}>
        <Button icon={<UploadOutlined />} onClick={() => document.getElementById('import-setup-file')?.click()}>
          Choose file…
        </Button>
        <input
          id="import-setup-file"
          data-testid="import-setup-file"
          type="file"
          accept=".json,application/json,.png,image/png,.svg,image/svg+xml"
          style={{ display: 'none' }}
          onChange={(e) => {
            const file = e.target.files?.[0];
            if (file) void readFile(file);
            e.target.value = '';
          }}
        />
        {source && <Typography.Text type="secondary">{source}</Typography.Text>}
      </Space>
      <Input.TextArea
        value={text}
        onChange={(e) => {
          setText(e.target.value);
          setSource(null);
          reset();
        }}
        placeholder='{ "format": "fieldbound-map", … } or a setup { "schemaVersion": 1, … }'
        autoSize={{ minRows: 8, maxRows: 16 }}
        aria-label="Setup JSON"
        style={{ fontFamily: 'ui-monospace, monospace', fontSize: 12 }}
      />
      {problems.length > 0 && (
        <Alert
          style={{ marginTop: 12 }}
          type="error"
          showIcon
          role="alert"
          title={problems.length === 1 ? 'The setup cannot be imported:' : `The setup cannot be imported (${problems.length} problems):`}
          description={
            <ul style={{ margin: 0, paddingLeft: 18 }} data-testid="import-problems">
              {problems.map((p, k) => (
                <li key={k}>{p.path === '(file)' ? p.message : `${p.path}: ${p.message}`}</li>
              ))}
            </ul>
          }
        />
      )}
      {warnings.length > 0 && (
        <Alert style={{ marginTop: 12 }} type="warning" showIcon title="Imported, with a note:" description={<ul style={{ margin: 0, paddingLeft: 18 }}>{warnings.map((w, k) => <li key={k}>{w}</li>)}</ul>} />
      )}
    </Modal>
  );
}
