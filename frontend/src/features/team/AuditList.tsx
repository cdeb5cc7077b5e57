import { Table } from 'antd';
import type { AuditEventView } from '../../api/types';

const WORDS: Record<string, (e: AuditEventView) => string> = {
  'team.created': (e) => `created the team “${String(e.details?.name ?? '')}”`,
  'team.renamed': (e) => `renamed the team from “${String(e.details?.from ?? '')}” to “${String(e.details?.to ?? '')}”`,
  'team.deleted': () => 'deleted the team',
  'member.joined': (e) => `joined as ${String(e.details?.role ?? '')}`,
  'member.role_changed': (e) => `changed the role of ${e.targetEmail} from ${String(e.details?.from)} to ${String(e.details?.to)}`,
  'member.removed': (e) => `removed ${e.targetEmail}`,
  'member.left': () => 'left the team',
  'invitation.created': (e) => `invited ${e.targetEmail} as ${String(e.details?.role ?? '')}`,
  'invitation.resent': (e) => `re-sent the invitation to ${e.targetEmail}`,
  'invitation.revoked': (e) => `revoked the invitation to ${e.targetEmail}`,
  'invitation.accepted': (e) => `accepted the invitation sent to ${e.targetEmail}`,
  'auth.registered': () => 'created the account',
  'auth.signed_in': () => 'signed in',
  'auth.sign_in_failed': () => 'failed sign-in attempt (wrong password)',
  'auth.signed_out': () => 'signed out',
  'auth.password_changed': () => 'changed the password',
  'auth.password_reset_requested': () => 'asked for a password reset link',
  'auth.password_reset': () => 'set a new password with a reset link',
  'auth.refresh_token_reused': () => 'a session token was used twice; the session was ended',
};

export function describeEvent(event: AuditEventView): string {
  return WORDS[event.action]?.(event) ?? event.action;
}

/** Who did what, and when, newest first. */
export function AuditList({ events, loading, showActor = true }: { events: AuditEventView[]; loading: boolean; showActor?: boolean }) {
  return (
    <Table<AuditEventView>
      rowKey="id"
      size="small"
      loading={loading}
      dataSource={events}
      pagination={events.length > 25 ? { pageSize: 25 } : false}
      locale={{ emptyText: 'Nothing recorded yet.' }}
      columns={[
        { title: 'When', dataIndex: 'createdAt', width: 200, render: (v: string) => new Date(v).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'medium' }) },
        ...(showActor ? [{ title: 'Who', dataIndex: 'actorEmail', width: 240, render: (v: string | null) => v ?? '—' }] : []),
        { title: 'What', key: 'what', render: (_: unknown, e: AuditEventView) => describeEvent(e) },
      ]}
    />
  );
}
