import { afterEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import { ApiError } from '../../api/client';
import type { SentInvitation } from '../../api/types';
import { renderWithProviders } from '../../test-utils';
import { InviteForm } from './InviteForm';

afterEach(() => {
  vi.restoreAllMocks();
});

function sent(email: string, emailSent = true): SentInvitation {
  const now = new Date().toISOString();
  return {
    emailSent,
    invitation: { id: 'i1', email, role: 'viewer', status: 'pending', invitedBy: null, createdAt: now, lastSentAt: now, sendCount: 1, expiresAt: now, mailStatus: 'sent', mailAttempts: 0, nextMailAttemptAt: null },
  };
}

// antd's first render is slow on a busy 2-core machine.
describe('InviteForm', { timeout: 20_000 }, () => {
  it('asks for an address when it is empty and does not send', async () => {
    const onInvite = vi.fn(async () => sent('x'));
    renderWithProviders(<InviteForm onInvite={onInvite} />);
    fireEvent.click(screen.getByRole('button', { name: 'Send invitation' }));
    expect(await screen.findByText('Enter the e-mail address to invite.')).toBeTruthy();
    expect(onInvite).not.toHaveBeenCalled();
  });

  it('refuses a malformed address and does not send', async () => {
    const onInvite = vi.fn(async () => sent('x'));
    renderWithProviders(<InviteForm onInvite={onInvite} />);
    fireEvent.change(screen.getByLabelText('E-mail address'), { target: { value: 'not an address' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send invitation' }));
    expect(await screen.findByText('Enter a valid e-mail address, such as name@institute.edu.')).toBeTruthy();
    expect(onInvite).not.toHaveBeenCalled();
  });

  it('sends the lower-cased address with the default role viewer and confirms', async () => {
    const onInvite = vi.fn(async ({ email }: { email: string }) => sent(email));
    renderWithProviders(<InviteForm onInvite={onInvite} />);
    const input = screen.getByLabelText('E-mail address') as HTMLInputElement;
    fireEvent.change(input, { target: { value: ' Lise@Institute.EDU ' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send invitation' }));
    await waitFor(() => expect(onInvite).toHaveBeenCalledWith({ email: 'lise@institute.edu', role: 'viewer' }));
    expect(await screen.findByText('Invitation sent to lise@institute.edu.')).toBeTruthy();
  });

  it('warns when the invitation was saved but the e-mail could not be sent', async () => {
    renderWithProviders(<InviteForm onInvite={async ({ email }) => sent(email, false)} />);
    fireEvent.change(screen.getByLabelText('E-mail address'), { target: { value: 'lise@institute.edu' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send invitation' }));
    expect(await screen.findByText(/could not be sent/)).toBeTruthy();
  });

  it('shows a 409 (already a member) beside the address field', async () => {
    const onInvite = vi.fn(async () => {
      throw new ApiError(409, 'This person is already a member of the team.', {
        code: 'already_member',
        errors: { email: ['This person is already a member of the team.'] },
      });
    });
    renderWithProviders(<InviteForm onInvite={onInvite} />);
    fireEvent.change(screen.getByLabelText('E-mail address'), { target: { value: 'member@institute.edu' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send invitation' }));
    expect(await screen.findByText('This person is already a member of the team.')).toBeTruthy();
    expect(screen.queryByRole('alert')).toBeNull();
  });
});
