import { Empty, Typography } from 'antd';
import type { ReactNode } from 'react';

/** A designed empty state: what this place is for and what to do next. */
export function EmptyPage({ title, children, action }: { title: string; children: ReactNode; action?: ReactNode }) {
  return (
    <div style={{ margin: 'auto', maxWidth: 520, padding: 48, textAlign: 'center' }}>
      <Empty
        image={Empty.PRESENTED_IMAGE_SIMPLE}
        description={
          <>
            <Typography.Title level={4}>{title}</Typography.Title>
            <Typography.Paragraph type="secondary">{children}</Typography.Paragraph>
          </>
        }
      >
        {action}
      </Empty>
    </div>
  );
}
