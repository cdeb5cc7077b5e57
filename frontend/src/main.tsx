import '@fontsource/ibm-plex-sans/400.css';
import '@fontsource/ibm-plex-sans/500.css';
import '@fontsource/ibm-plex-sans/600.css';
import 'virtual:antd-styles.css';
import './theme/global.css';
import { StrictMode, startTransition } from 'react';
import { createRoot } from 'react-dom/client';
import { RouterProvider, createBrowserRouter } from 'react-router-dom';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { App as AntdApp, ConfigProvider } from 'antd';
import { App } from './App';
import { lightTheme } from './theme/theme';
import { CurrentTeamProvider } from './state/currentTeam';

const queryClient = new QueryClient({
  defaultOptions: { queries: { staleTime: 15_000, refetchOnWindowFocus: false } },
});

// A data router (so pages can ask before unsaved changes are lost, see UnsavedChangesGuard); the routes
// themselves stay declared as <Routes> in App.
const router = createBrowserRouter([{ path: '*', element: <App /> }]);

// The first render as a transition: React renders the shell in slices and yields between them, so opening the app
// is not one long main-thread task.
const root = createRoot(document.getElementById('root')!);
startTransition(() => {
  root.render(
    <StrictMode>
      <ConfigProvider theme={lightTheme}>
        <AntdApp>
          <QueryClientProvider client={queryClient}>
            <CurrentTeamProvider>
              <RouterProvider router={router} />
            </CurrentTeamProvider>
          </QueryClientProvider>
        </AntdApp>
      </ConfigProvider>
    </StrictMode>,
  );
});
