import { useState } from 'react';
import { Alert, Button, Dropdown, Modal, Progress, type MenuProps } from 'antd';
import { DownloadOutlined } from '@ant-design/icons';
import { OpenedOnce } from '../../components/OpenedOnce';
import {
  ENGINE_VERSION, estimateMapCsv, estimateMapJson, mapCsvChunks, mapJsonChunks,
  type BindingMapResult, type MapSetup, type PhaseMapResult,
} from '@fieldbound/shared';
import { blobFromChunks, downloadBlob, fileNameFrom } from './download';
import { FigureExportModal } from './FigureExportModal';
import { MethodsNoteModal } from './MethodsNoteModal';
import type { FigureRequest } from './exportFigure';

export interface ExportMenuProps {
  setup: MapSetup;
  bindingMap?: BindingMapResult | null;
  phaseMap?: PhaseMapResult | null;
  /** The map view's SVG element (the d3 scene the figure is made from), or null when nothing is drawn. */
  getFigureSvg: () => SVGSVGElement | null;
  title: string;
  /** Clock for the file dates (injectable for tests). */
  now?: () => Date;
  /** Byte limits of the data exports (default: the engine's EXPORT_LIMITS). */
  maxBytes?: { csv?: number; json?: number };
  /** Replaces the figure file writing (tests). */
  figureExporter?: (source: SVGSVGElement, setup: MapSetup, request: FigureRequest, date: Date) => Promise<string | null>;
}

type Dialog = 'figure' | 'methods' | null;
interface Notice {
  kind: 'error' | 'progress';
  text: string;
  percent?: number;
}

/**
 * The map page's export menu: the figure (SVG, PNG, PDF), the data (CSV, JSON with setup and results),
 * the setup alone (JSON), and the methods note. Data exports state their size first and refuse a map
 * too large for the chosen format with a message naming the way out.
 */
export function ExportMenu({ setup, bindingMap, phaseMap, getFigureSvg, title, now = () => new Date(), maxBytes, figureExporter }: ExportMenuProps) {
  const [dialog, setDialog] = useState<Dialog>(null);
  const [notice, setNotice] = useState<Notice | null>(null);
  const binding = bindingMap ?? null;
  const phase = binding ? (phaseMap ?? null) : null;

  const saveCsv = async () => {
    if (!binding) return;
    const date = now().toISOString();
    const input = { setup, binding, phase, date };
    const est = estimateMapCsv(input, { maxBytes: maxBytes?.csv });
    if (!est.ok) {
      setNotice({ kind: 'error', text: est.message });
      return;
    }
    setNotice({ kind: 'progress', text: `Writing ${est.rows.toLocaleString('en')} rows…`, percent: 0 });
    const blob = await blobFromChunks(mapCsvChunks(input), 'text/csv;charset=utf-8', (chars) => setNotice({ kind: 'progress', text: `Writing ${est.rows.toLocaleString('en')} rows…`, percent: Math.min(99, Math.round((100 * chars) / est.bytes)) }));
    downloadBlob(blob, fileNameFrom(title, 'csv'));
    setNotice(null);
  };

  const saveJson = async (withResults: boolean) => {
    const input = { setup, engineVersion: binding?.engineVersion ?? ENGINE_VERSION, binding: withResults ? binding : null, phase: withResults ? phase : null, date: now().toISOString() };
    const est = estimateMapJson(input, { maxBytes: maxBytes?.json });
    if (!est.ok) {
      setNotice({ kind: 'error', text: est.message });
      return;
    }
    const blob = await blobFromChunks(mapJsonChunks(input), 'application/json');
    downloadBlob(blob, fileNameFrom(withResults ? title : `${title}-setup`, 'json'));
    setNotice(null);
  };

  const run = (job: () => Promise<void>) => {
    job().catch((e: unknown) => setNotice({ kind: 'error', text: `The export failed: ${(e as Error).message}` }));
  };

  const items: MenuProps['items'] = [
    { key: 'figure', label: 'Figure (SVG, PNG, PDF)…' },
    { type: 'divider' },
    { key: 'csv', label: 'Data as CSV', disabled: !binding, title: binding ? undefined : 'Compute the map first' },
    { key: 'json', label: 'Map as JSON (setup and results)', disabled: !binding, title: binding ? undefined : 'Compute the map first' },
    { key: 'setup', label: 'Setup as JSON' },
    { type: 'divider' },
    { key: 'methods', label: 'Methods note…' },
  ];
  const onClick: MenuProps['onClick'] = ({ key }) => {
    setNotice(null);
    if (key === 'figure' || key === 'methods') setDialog(key);
    else if (key === 'csv') run(saveCsv);
    else if (key === 'json') run(() => saveJson(true));
    else if (key === 'setup') run(() => saveJson(false));
  };

  return (
    <>
      <Dropdown menu={{ items, onClick }} trigger={['click']}>
        <Button icon={<DownloadOutlined />}>Export</Button>
      </Dropdown>
      <OpenedOnce open={dialog === 'figure'}>
        <FigureExportModal open={dialog === 'figure'} onClose={() => setDialog(null)} setup={setup} title={title} getFigureSvg={getFigureSvg} now={now} exporter={figureExporter} />
      </OpenedOnce>
      <OpenedOnce open={dialog === 'methods'}>
        <MethodsNoteModal open={dialog === 'methods'} onClose={() => setDialog(null)} setup={setup} bindingMap={binding} />
      </OpenedOnce>
      <OpenedOnce open={notice !== null}>
        <Modal open={notice !== null} title="Export" onCancel={() => setNotice(null)} footer={notice?.kind === 'error' ? <Button onClick={() => setNotice(null)}>Close</Button> : null} closable={notice?.kind === 'error'}>
          {notice?.kind === 'error' && <Alert type="error" showIcon role="alert" title={notice.text} />}
          {notice?.kind === 'progress' && (
            <>
              <div>{notice.text}</div>
              <Progress percent={notice.percent ?? 0} />
            </>
          )}
        </Modal>
      </OpenedOnce>
    </>
  );
}
