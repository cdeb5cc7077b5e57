import { afterEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import { ApiError } from '../../api/client';
import { renderWithProviders } from '../../test-utils';
import { SignInForm } from './SignInForm';

afterEach(() => {
  vi.restoreAllMocks();
});

function fill(label: string, value: string) {
  fireEvent.change(screen.getByLabelText(label), { target: { value } });
}

// antd's first render is slow on a busy 2-core machine.
describe('SignInForm', { timeout: 20_000 }, () => {
  it('shows "Enter your e-mail address." and "Enter your password." beside the empty fields and does not submit', async () => {
    const onSubmit = vi.fn(async () => undefined);
    renderWithProviders(<SignInForm onSubmit={onSubmit} />);
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('Enter your e-mail address.')).toBeTruthy();
    expect(await screen.findByText('Enter your password.')).toBeTruthy();
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it('refuses a malformed address with an explanation and does not submit', async () => {
    const onSubmit = vi.fn(async () => undefined);
    renderWithProviders(<SignInForm onSubmit={onSubmit} />);
    fill('E-mail address', 'ada-at-institute');
    fill('Password', 'whatever it is');
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('Enter a valid e-mail address, such as name@institute.edu.')).toBeTruthy();
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it('submits the trimmed address and the password as typed', async () => {
    const onSubmit = vi.fn(async () => undefined);
    renderWithProviders(<SignInForm onSubmit={onSubmit} />);
    fill('E-mail address', '  ada@institute.edu ');
    fill('Password', ' spaces count ');
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalledWith({ email: 'ada@institute.edu', password: ' spaces count ' }));
  });

  it('shows the server’s refusal (wrong e-mail or password) above the form', async () => {
    const onSubmit = vi.fn(async () => {
      throw new ApiError(401, 'The e-mail address or the password is not correct.', { code: 'invalid_credentials' });
    });
    renderWithProviders(<SignInForm onSubmit={onSubmit} />);
    fill('E-mail address', 'ada@institute.edu');
    fill('Password', 'wrong password');
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect((await screen.findByRole('alert')).textContent).toContain('The e-mail address or the password is not correct.');
  });

  it('puts the server’s per-field messages beside the field they concern', async () => {
    const onSubmit = vi.fn(async () => {
      throw new ApiError(400, 'Some fields need attention.', { errors: { email: ['An e-mail address has at most 254 characters.'] } });
    });
    renderWithProviders(<SignInForm onSubmit={onSubmit} />);
    fill('E-mail address', 'ada@institute.edu');
    fill('Password', 'long enough');
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('An e-mail address has at most 254 characters.')).toBeTruthy();
    expect(screen.queryByRole('alert')).toBeNull();
  });
});
