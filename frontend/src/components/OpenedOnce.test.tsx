import { describe, expect, it } from 'vitest';
import { render, screen } from '@testing-library/react';
import { OpenedOnce } from './OpenedOnce';

describe('OpenedOnce', () => {
  it('renders nothing until first opened, then stays mounted when closed again', () => {
    let renders = 0;
    const Dialog = ({ open }: { open: boolean }) => {
      renders++;
      return <div role="dialog" data-open={open} />;
    };
    const page = (open: boolean) => (
      <OpenedOnce open={open}>
        <Dialog open={open} />
      </OpenedOnce>
    );
    const { rerender } = render(page(false));
    rerender(page(false));
    expect(screen.queryByRole('dialog')).toBeNull();
    expect(renders).toBe(0);
    rerender(page(true));
    expect(screen.getByRole('dialog').dataset.open).toBe('true');
    rerender(page(false));
    expect(screen.getByRole('dialog').dataset.open).toBe('false');
  });
});
