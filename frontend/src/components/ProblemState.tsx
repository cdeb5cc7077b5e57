import type { ReactNode } from 'react';
import { Button, Result, Space, Typography } from 'antd';
import { CloudServerOutlined, DisconnectOutlined, ToolOutlined } from '@ant-design/icons';
import { ApiError } from '../api/client';
import { palette } from '../theme/palette';

/** What went wrong, in the reader's terms: the kind decides the words and the way out. */
export type ProblemKind = 'offline' | 'unavailable' | 'server' | 'not-found' | 'other';

export interface ProblemText {
  kind: ProblemKind;
  title: string;
  detail: string;
}

/**
 * Turns a failed request into words about `what` ("the maps", "this map"…). A request that never reached the server
 * (status 0), a server that answered 503 (its database is away, or it is starting or shedding load) and other server
 * failures each get their own explanation; 404/403 is "not available" (a non-member must not learn more).
 */
export function describeProblem(error: unknown, what: string): ProblemText {
  const status = error instanceof ApiError ? error.status : -1;
  if (status === 0) {
    return {
      kind: 'offline',
      title: `Fieldbound cannot reach its server`,
      detail: `${capitalise(what)} could not be loaded because the server did not answer. Check the network connection (or whether the server is still running) and try again. Nothing you had open in this browser is lost.`,
    };
  }
  if (status === 503) {
    return {
      kind: 'unavailable',
      title: 'The server is up, but cannot serve this right now',
      detail: `Its database is out of reach or it is too busy at the moment, so ${what} could not be loaded. This usually passes within a minute: try again shortly.`,
    };
  }
  if (status === 404 || status === 403) {
    return { kind: 'not-found', title: `${capitalise(what)} is not available`, detail: 'It may have been deleted, or it belongs to a team you are not a member of.' };
  }
  if (status >= 500) {
    return {
      kind: 'server',
      title: `The server failed while loading ${what}`,
      detail: `It answered with an internal error (${status}). Trying again often helps; if it keeps happening, the server's log says why.`,
    };
  }
  const message = error instanceof Error ? error.message : String(error);
  return { kind: 'other', title: `${capitalise(what)} could not be loaded`, detail: message };
}

function capitalise(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

const ICON: Record<ProblemKind, ReactNode> = {
  offline: <DisconnectOutlined style={{ color: palette.ink }} />,
  unavailable: <CloudServerOutlined style={{ color: palette.ink }} />,
  server: <ToolOutlined style={{ color: palette.ink }} />,
  'not-found': <DisconnectOutlined style={{ color: palette.ink }} />,
  other: <ToolOutlined style={{ color: palette.ink }} />,
};

/** A page-sized problem: a quiet icon, what happened, and the ways out (Try again, and an optional extra action). */
export function ProblemState({ error, what, onRetry, extra }: { error: unknown; what: string; onRetry?: () => void; extra?: ReactNode }) {
  const p = describeProblem(error, what);
  return (
    <div data-testid="problem-state" data-kind={p.kind} style={{ margin: 'auto', maxWidth: 640 }}>
      <Result
        icon={ICON[p.kind]}
        title={p.title}
        subTitle={p.detail}
        extra={
          <Space>
            {onRetry && p.kind !== 'not-found' && (
              <Button type="primary" onClick={onRetry}>
                Try again
              </Button>
            )}
            {extra}
          </Space>
        }
      />
    </div>
  );
}

/** The same in one line, for a table's empty area or above a list. */
export function ProblemLine({ error, what, onRetry }: { error: unknown; what: string; onRetry?: () => void }) {
  const p = describeProblem(error, what);
  return (
    <Space orientation="vertical" size={2} data-testid="problem-line" data-kind={p.kind} style={{ maxWidth: 560 }}>
      <Typography.Text strong>{p.title}</Typography.Text>
      <Typography.Text type="secondary">{p.detail}</Typography.Text>
      {onRetry && p.kind !== 'not-found' && (
        <Button size="small" onClick={onRetry}>
          Try again
        </Button>
      )}
    </Space>
  );
}
