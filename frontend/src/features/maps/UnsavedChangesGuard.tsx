import { useContext, useEffect } from 'react';
import { Modal } from 'antd';
import { OpenedOnce } from '../../components/OpenedOnce';
import { UNSAFE_DataRouterContext, useBlocker, type BlockerFunction } from 'react-router-dom';

/** The browser's own "Leave site?" question on reload, close and typed URLs while `when` holds. */
function useBeforeUnload(when: boolean) {
  useEffect(() => {
    if (!when) return;
    const handler = (event: BeforeUnloadEvent) => {
      event.preventDefault();
      event.returnValue = '';
    };
    window.addEventListener('beforeunload', handler);
    return () => window.removeEventListener('beforeunload', handler);
  }, [when]);
}

function RouterBlocker({ shouldBlock, message }: { shouldBlock: BlockerFunction; message: string }) {
  const blocker = useBlocker(shouldBlock);
  return (
    <OpenedOnce open={blocker.state === 'blocked'}>
      <Modal
        open={blocker.state === 'blocked'}
        title="Leave without saving?"
        okText="Leave"
        okButtonProps={{ danger: true }}
        cancelText="Stay"
        onOk={() => blocker.proceed?.()}
        onCancel={() => blocker.reset?.()}
      >
        {message}
      </Modal>
    </OpenedOnce>
  );
}

/**
 * Warns before unsaved changes are lost: in-app navigation to another page asks first (changes of the query string —
 * the view state the explorer keeps in the URL — never do), and the browser asks on reload or close.
 * `when` is read at navigation time through the function, so a deliberate navigation can pass by clearing it first.
 */
export function UnsavedChangesGuard({ when, message }: { when: () => boolean; message: string }) {
  // useBlocker needs a data router; in a plain <MemoryRouter> (component tests) only the beforeunload part works.
  const dataRouter = useContext(UNSAFE_DataRouterContext);
  const active = when();
  useBeforeUnload(active);
  if (!dataRouter) return null;
  return <RouterBlocker message={message} shouldBlock={({ currentLocation, nextLocation }) => currentLocation.pathname !== nextLocation.pathname && when()} />;
}
