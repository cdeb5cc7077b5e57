import { useState } from 'react';
import { Alert, Button, Checkbox, Form, Input, InputNumber, Modal, Segmented, Space, Typography } from 'antd';
import { ENGINE_VERSION, figureMetadata, type MapSetup } from '@fieldbound/shared';
import { exportFigure, figureHeightMm, type FigureFormat, type FigureRequest } from './exportFigure';
import { pngPixelSize } from './figurePng';

export interface FigureExportModalProps {
  open: boolean;
  onClose: () => void;
  setup: MapSetup;
  title: string;
  getFigureSvg: () => SVGSVGElement | null;
  now: () => Date;
  /** Replaces the file writing (tests). */
  exporter?: (source: SVGSVGElement, setup: MapSetup, request: FigureRequest, date: Date) => Promise<string | null>;
}

const FORMAT_OPTIONS: { value: FigureFormat; label: string }[] = [
  { value: 'svg', label: 'SVG' },
  { value: 'png', label: 'PNG' },
  { value: 'pdf', label: 'PDF' },
];

/** Figure export: format, printed size, PNG resolution, what to include, the caption title. */
export function FigureExportModal({ open, onClose, setup, title, getFigureSvg, now, exporter = exportFigure }: FigureExportModalProps) {
  const [request, setRequest] = useState<FigureRequest>({ format: 'svg', title, widthMm: 170, dpi: 300, pins: true, species: true, caption: true });
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [note, setNote] = useState<string | null>(null);
  const set = (patch: Partial<FigureRequest>) => {
    setRequest((r) => ({ ...r, ...patch }));
    setError(null);
    setNote(null);
  };

  const source = open ? getFigureSvg() : null;
  let sizeText = '';
  let sizeProblem: string | null = null;
  if (source) {
    try {
      const meta = figureMetadata(setup, { engineVersion: ENGINE_VERSION, date: now().toISOString(), title: request.title });
      const h = figureHeightMm(source, request.widthMm, request.caption, meta);
      sizeText = `${request.widthMm} × ${Math.round(h)} mm`;
      if (request.format === 'png') {
        const px = pngPixelSize(request.widthMm, h, request.dpi);
        sizeText += ` = ${px.width} × ${px.height} pixels`;
      }
    } catch (e) {
      sizeProblem = (e as Error).message;
    }
  }

  const run = async () => {
    const svg = getFigureSvg();
    if (!svg) {
      setError('The map is not drawn yet: compute it first, then export the figure.');
      return;
    }
    setBusy(true);
    setError(null);
    try {
      const warning = await exporter(svg, setup, request, now());
      setNote(warning ?? `Saved the ${request.format.toUpperCase()} figure.`);
    } catch (e) {
      setError(`The figure could not be made: ${(e as Error).message}`);
    } finally {
      setBusy(false);
    }
  };

  return (
    <Modal
      open={open}
      onCancel={onClose}
      title="Export figure"
      destroyOnHidden
      footer={
        <Space>
          <Button onClick={onClose}>Close</Button>
          <Button type="primary" loading={busy} disabled={!source || sizeProblem !== null || !(request.widthMm > 0)} onClick={() => void run()}>
            Export {request.format.toUpperCase()}
          </Button>
        </Space>
      }
    >
      <Form layout="vertical" size="small">
        <Form.Item label="Format">
          <Segmented options={FORMAT_OPTIONS} value={request.format} onChange={(v) => set({ format: v as FigureFormat })} />
        </Form.Item>
        <Form.Item label="Caption title">
          <Input value={request.title} onChange={(e) => set({ title: e.target.value })} aria-label="Caption title" />
        </Form.Item>
        <Space size="large" wrap>
          <Form.Item label="Width (mm)">
            <InputNumber min={20} max={1000} value={request.widthMm} onChange={(v) => set({ widthMm: Number(v) || 0 })} aria-label="Width in millimetres" />
          </Form.Item>
          {request.format === 'png' && (
            <Form.Item label="Resolution (dpi)">
              <InputNumber min={36} max={1200} value={request.dpi} onChange={(v) => set({ dpi: Number(v) || 0 })} aria-label="Resolution in dots per inch" />
            </Form.Item>
          )}
        </Space>
        <Form.Item>
          <Space direction="vertical" size={2}>
            <Checkbox checked={request.caption} onChange={(e) => set({ caption: e.target.checked })}>
              Caption block (title, model caveat, engine version and fingerprint)
            </Checkbox>
            <Checkbox checked={request.pins} onChange={(e) => set({ pins: e.target.checked })}>
              Pins
            </Checkbox>
            <Checkbox checked={request.species} onChange={(e) => set({ species: e.target.checked })}>
              Species labels
            </Checkbox>
          </Space>
        </Form.Item>
      </Form>
      {!source && <Alert type="info" showIcon title="The map is not drawn yet: compute it first, then export the figure." />}
      {source && sizeText && !sizeProblem && <Typography.Text type="secondary">Size: {sizeText}. The setup, engine version and date are written into the file.</Typography.Text>}
      {sizeProblem && <Alert type="error" showIcon role="alert" title={sizeProblem} />}
      {error && <Alert style={{ marginTop: 8 }} type="error" showIcon role="alert" title={error} />}
      {note && <Alert style={{ marginTop: 8 }} type={note.startsWith('Saved') ? 'success' : 'warning'} showIcon title={note} />}
    </Modal>
  );
}
