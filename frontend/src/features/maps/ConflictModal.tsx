import { Alert, Button, Descriptions, Modal, Space, Typography } from 'antd';
import type { MapDetail } from '@fieldbound/shared';
import { formatDateTime, personName } from './MapBits';

export interface ConflictModalProps {
  /** The map as the server has it now (the 409's `current`), or null when there is no conflict. */
  theirs: MapDetail | null;
  onReloadTheirs: () => void;
  onKeepMineAsCopy: () => void;
  onClose: () => void;
  copying?: boolean;
  error?: string | null;
}

/**
 * After a stale save: someone saved this map since it was opened. Nothing was overwritten; the person chooses to load
 * the newer version (dropping their edits) or to keep their setup as a new map.
 */
export function ConflictModal({ theirs, onReloadTheirs, onKeepMineAsCopy, onClose, copying = false, error = null }: ConflictModalProps) {
  return (
    <Modal
      title="This map was saved by someone else"
      open={!!theirs}
      onCancel={onClose}
      maskClosable={false}
      footer={
        <Space>
          <Button onClick={onClose}>Cancel</Button>
          <Button onClick={onKeepMineAsCopy} loading={copying}>
            Keep mine as a copy
          </Button>
          <Button type="primary" onClick={onReloadTheirs} disabled={copying}>
            Reload theirs
          </Button>
        </Space>
      }
    >
      {theirs && (
        <>
          <Typography.Paragraph>
            Your changes were not saved: the map moved on to version {theirs.version} while you were editing. Nothing of theirs or yours has been overwritten.
          </Typography.Paragraph>
          <Descriptions size="small" column={1} bordered>
            <Descriptions.Item label="Saved version">{theirs.version}</Descriptions.Item>
            <Descriptions.Item label="Title">{theirs.title}</Descriptions.Item>
            <Descriptions.Item label="Saved by">{personName(theirs.updatedBy)}</Descriptions.Item>
            <Descriptions.Item label="Saved at">{formatDateTime(theirs.updatedAt)}</Descriptions.Item>
          </Descriptions>
          <Typography.Paragraph type="secondary" style={{ marginTop: 12, marginBottom: 0 }}>
            <b>Reload theirs</b> opens version {theirs.version} and drops your unsaved changes. <b>Keep mine as a copy</b> makes a new map in this team with your setup.
          </Typography.Paragraph>
          {error && <Alert style={{ marginTop: 12 }} type="error" showIcon message={error} />}
        </>
      )}
    </Modal>
  );
}
