import { Card, Typography } from 'antd';
import type { ReactNode } from 'react';

/** The narrow centred card of the account pages: a title, a line of context, the form, links below. */
export function AuthCard({ title, intro, children, footer }: { title: string; intro?: ReactNode; children: ReactNode; footer?: ReactNode }) {
  return (
    <div style={{ margin: '48px auto', width: '100%', maxWidth: 420, padding: '0 16px' }}>
      <Card>
        <Typography.Title level={3} style={{ marginTop: 0 }}>
          {title}
        </Typography.Title>
        {intro && (
          <Typography.Paragraph type="secondary" style={{ marginBottom: 24 }}>
            {intro}
          </Typography.Paragraph>
        )}
        {children}
      </Card>
      {footer && <div style={{ marginTop: 16, textAlign: 'center' }}>{footer}</div>}
    </div>
  );
}
