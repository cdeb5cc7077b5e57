import { useMemo, useState } from 'react';
import { Button, Input, Modal, Space, Typography } from 'antd';
import { CopyOutlined } from '@ant-design/icons';
import { ENGINE_VERSION, methodsBibtex, methodsNote, type BindingMapResult, type MapSetup } from '@fieldbound/shared';

export interface MethodsNoteModalProps {
  open: boolean;
  onClose: () => void;
  setup: MapSetup;
  bindingMap?: BindingMapResult | null;
}

/** Copies text, falling back to selecting a hidden textarea where the Clipboard API is missing. */
async function copyText(text: string): Promise<void> {
  if (navigator.clipboard?.writeText) {
    await navigator.clipboard.writeText(text);
    return;
  }
  const area = document.createElement('textarea');
  area.value = text;
  document.body.appendChild(area);
  area.select();
  document.execCommand('copy');
  area.remove();
}

/** The methods note and its BibTeX, generated from the setup, each with a Copy button. */
export function MethodsNoteModal({ open, onClose, setup, bindingMap }: MethodsNoteModalProps) {
  // Written only while the dialog is open: the note reads the whole map, and the closed dialog re-renders with every
  // computed map of the page.
  const note = useMemo(() => (open ? methodsNote(setup, { engineVersion: bindingMap?.engineVersion ?? ENGINE_VERSION, binding: bindingMap ?? null }) : ''), [open, setup, bindingMap]);
  const bibtex = useMemo(() => (open ? methodsBibtex(setup) : ''), [open, setup]);
  const [copied, setCopied] = useState<'note' | 'bibtex' | null>(null);
  const [copyError, setCopyError] = useState<string | null>(null);
  const copy = (what: 'note' | 'bibtex') => {
    setCopyError(null);
    copyText(what === 'note' ? note : bibtex).then(
      () => setCopied(what),
      (e: unknown) => setCopyError(`Could not copy: ${(e as Error).message}. Select the text and copy it by hand.`),
    );
  };
  return (
    <Modal open={open} onCancel={onClose} title="Methods note" width={860} footer={<Button onClick={onClose}>Close</Button>} destroyOnHidden>
      <Typography.Paragraph type="secondary">
        Generated from this map&apos;s setup: the model, its validity limits, the numerical methods and tolerances, the constants and the exact parameter values. Check the references against the publishers before submitting.
      </Typography.Paragraph>
      <Space style={{ marginBottom: 8 }}>
        <Typography.Text strong>Text</Typography.Text>
        <Button size="small" icon={<CopyOutlined />} onClick={() => copy('note')}>
          {copied === 'note' ? 'Copied' : 'Copy text'}
        </Button>
      </Space>
      <Input.TextArea value={note} readOnly autoSize={{ minRows: 8, maxRows: 16 }} aria-label="Methods note text" style={{ fontSize: 13 }} />
      <Space style={{ margin: '16px 0 8px' }}>
        <Typography.Text strong>BibTeX</Typography.Text>
        <Button size="small" icon={<CopyOutlined />} onClick={() => copy('bibtex')}>
          {copied === 'bibtex' ? 'Copied' : 'Copy BibTeX'}
        </Button>
      </Space>
      <Input.TextArea value={bibtex} readOnly autoSize={{ minRows: 6, maxRows: 12 }} aria-label="Methods note BibTeX" style={{ fontFamily: 'ui-monospace, monospace', fontSize: 12 }} />
      {copyError && (
        <Typography.Paragraph type="danger" role="alert" style={{ marginTop: 8 }}>
          {copyError}
        </Typography.Paragraph>
      )}
    </Modal>
  );
}
