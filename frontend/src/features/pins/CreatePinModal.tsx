import { useEffect } from 'react';
import { AutoComplete, Form, Input, Modal, type FormInstance } from 'antd';
import { PIN_LIMITS, type CreatePinRequest, type PinGeometry } from '@fieldbound/shared';

const KIND_WORD: Record<PinGeometry['kind'], string> = { point: 'point', rect: 'rectangle', polygon: 'polygon' };

export interface CreatePinModalProps {
  geometry: PinGeometry | null;
  categories: readonly string[];
  saving: boolean;
  onSubmit: (request: CreatePinRequest, form: FormInstance) => void;
  onCancel: () => void;
}

/** Title, description and category of a new pin on the drawn geometry. */
export function CreatePinModal({ geometry, categories, saving, onSubmit, onCancel }: CreatePinModalProps) {
  const [form] = Form.useForm<{ title: string; body: string; category: string }>();
  useEffect(() => {
    if (geometry) form.resetFields();
  }, [geometry, form]);
  return (
    <Modal
      title={geometry ? `New pin on a ${KIND_WORD[geometry.kind]}` : 'New pin'}
      open={geometry !== null}
      okText="Add pin"
      onOk={() => form.submit()}
      confirmLoading={saving}
      onCancel={onCancel}
      destroyOnHidden
    >
      <Form
        form={form}
        layout="vertical"
        onFinish={(v) => geometry && onSubmit({ geometry, title: v.title.trim(), body: v.body?.trim() ?? '', category: v.category?.trim() || null }, form)}
      >
        <Form.Item name="title" label="Title" rules={[{ required: true, whitespace: true, message: 'Give the pin a short title.' }, { max: PIN_LIMITS.maxTitleLength }]}>
          <Input autoFocus maxLength={PIN_LIMITS.maxTitleLength} />
        </Form.Item>
        <Form.Item name="body" label="What to discuss">
          <Input.TextArea autoSize={{ minRows: 3, maxRows: 10 }} maxLength={PIN_LIMITS.maxBodyLength} />
        </Form.Item>
        <Form.Item name="category" label="Category">
          <AutoComplete options={categories.map((c) => ({ value: c }))} placeholder="e.g. candidate, check, question" maxLength={PIN_LIMITS.maxCategoryLength} />
        </Form.Item>
      </Form>
    </Modal>
  );
}
