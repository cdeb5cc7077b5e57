import { describe, expect, it } from 'vitest';
import { screen } from '@testing-library/react';
import type { InvitationView } from '../../api/types';
import { renderWithProviders } from '../../test-utils';
import { InvitationsTable } from './InvitationsTable';

function invitation(email: string, extra: Partial<InvitationView>): InvitationView {
  const now = new Date().toISOString();
  return { id: email, email, role: 'viewer', status: 'pending', invitedBy: null, createdAt: now, lastSentAt: now, sendCount: 1, expiresAt: now, mailStatus: 'sent', mailAttempts: 0, nextMailAttemptAt: null, ...extra };
}

// antd's first render is slow on a busy 2-core machine.
describe('InvitationsTable', { timeout: 20_000 }, () => {
  it('marks an invitation whose e-mail is not delivered yet as mail pending, and only that one', async () => {
    const later = new Date(Date.now() + 60_000).toISOString();
    renderWithProviders(
      <InvitationsTable
        teamId="t1"
        loading={false}
        invitations={[
          invitation('waiting@lab.test', { mailStatus: 'pending', mailAttempts: 2, nextMailAttemptAt: later }),
          invitation('delivered@lab.test', {}),
        ]}
      />,
    );
    expect(await screen.findByText('waiting@lab.test')).toBeTruthy();
    expect(screen.getByText('delivered@lab.test')).toBeTruthy();
    const pending = screen.getAllByTestId('mail-pending');
    expect(pending).toHaveLength(1);
    expect(pending[0].closest('tr')?.textContent).toContain('waiting@lab.test');
  });
});
