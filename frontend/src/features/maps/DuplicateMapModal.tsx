import { Alert, Form, Input, Modal, Select } from 'antd';
import { useState } from 'react';
import { MAP_LIMITS, type MapDetail, type MapListItem } from '@fieldbound/shared';
import { useDuplicateMap } from '../../api/maps';
import { applyServerErrors } from '../../components/forms';
import { useCurrentTeam } from '../../state/currentTeam';

interface Values {
  title: string;
  teamId: string;
}

/** Copies a map into this team or another team where the person may create maps (editor or owner). */
export function DuplicateMapModal({ map, onClose, onDuplicated }: { map: MapListItem | null; onClose: () => void; onDuplicated: (copy: MapDetail) => void }) {
  const { teams } = useCurrentTeam();
  const targets = teams.filter((t) => t.role === 'editor' || t.role === 'owner');
  const [form] = Form.useForm<Values>();
  const duplicate = useDuplicateMap();
  const [error, setError] = useState<string | null>(null);

  const submit = async (values: Values) => {
    if (!map) return;
    setError(null);
    try {
      const copy = await duplicate.mutateAsync({ mapId: map.id, title: values.title, teamId: values.teamId });
      onDuplicated(copy);
    } catch (e) {
      setError(applyServerErrors(form, e, ['title', 'teamId']));
    }
  };

  return (
    <Modal title="Duplicate map" open={!!map} onCancel={onClose} okText="Duplicate" onOk={() => form.submit()} confirmLoading={duplicate.isPending} destroyOnHidden>
      {map && (
        <Form form={form} layout="vertical" onFinish={submit} initialValues={{ title: `${map.title} (copy)`.slice(0, MAP_LIMITS.maxTitleLength), teamId: map.teamId }} requiredMark={false}>
          <Form.Item name="title" label="Title of the copy" rules={[{ required: true, whitespace: true, message: 'Give the copy a title.' }, { max: MAP_LIMITS.maxTitleLength }]}>
            <Input />
          </Form.Item>
          <Form.Item name="teamId" label="Into team" extra="Teams where you may create maps.">
            <Select aria-label="Into team" options={targets.map((t) => ({ value: t.id, label: t.name }))} />
          </Form.Item>
          {error && <Alert type="error" showIcon message={error} />}
        </Form>
      )}
    </Modal>
  );
}
