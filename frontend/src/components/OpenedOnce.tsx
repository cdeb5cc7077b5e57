import { useState, type ReactNode } from 'react';

/**
 * Renders a dialog or drawer from the first time it opens on. A closed antd Modal or Drawer still renders its hooks and
 * styles on every render of its parent; a page with several of them (share, versions, conflict, pins, exports) paid
 * for all of them in its first renders, inside the first visit's longest tasks. Once opened it stays mounted, so
 * closing animates as usual.
 */
export function OpenedOnce({ open, children }: { open: boolean; children: ReactNode }) {
  const [opened, setOpened] = useState(open);
  // A state update during render, for this component only: React re-renders it at once, before committing.
  if (open && !opened) setOpened(true);
  return opened || open ? children : null;
}
