import { afterEach, describe, expect, it, vi } from 'vitest';
import { configure, fireEvent, screen, waitFor, within } from '@testing-library/react';
import { fakeApi } from '../features/maps/testApi';
import { renderWithProviders } from '../test-utils';
import { SpeciesUpload } from './SpeciesPage';

vi.setConfig({ testTimeout: 60_000 });
configure({ asyncUtilTimeout: 15_000 });

afterEach(() => {
  vi.restoreAllMocks();
});

describe('SpeciesUpload', () => {
  it('shows every problem of a rejected CSV by line and column, and says nothing was imported', async () => {
    const calls = fakeApi({
      'POST /api/teams/t1/species-lists': () => ({
        status: 400,
        body: {
          statusCode: 400,
          code: 'csv_rejected',
          message: 'The file has 2 problems.',
          issues: [
            { line: 3, column: 'polarizability', message: 'Not a number: "abc".' },
            { line: 7, column: null, message: 'The line has 5 fields; the header has 7.' },
          ],
        },
      }),
    });
    renderWithProviders(<SpeciesUpload teamId="t1" open onClose={() => undefined} />);
    fireEvent.change(await screen.findByLabelText('Name of the list'), { target: { value: 'Our atoms' } });
    const input = document.body.querySelector('input[type="file"]') as HTMLInputElement;
    const file = new File(['name,polarizability\nX,abc\n'], 'atoms.csv', { type: 'text/csv' });
    fireEvent.change(input, { target: { files: [file] } });
    await screen.findByText('atoms.csv');
    fireEvent.click(screen.getByRole('button', { name: 'Upload' }));
    expect(await screen.findByText(/Nothing was imported/)).toBeTruthy();
    const problems = await screen.findByText('Not a number: "abc".');
    const row = problems.closest('tr')!;
    expect(within(row).getByText('3')).toBeTruthy();
    expect(within(row).getByText('polarizability')).toBeTruthy();
    expect(screen.getByText('whole line')).toBeTruthy();
    await waitFor(() => expect(calls.some((c) => c.method === 'POST' && c.body instanceof FormData && (c.body as FormData).get('name') === 'Our atoms')).toBe(true));
  });
});
