import '@fontsource/inter/400.css';
import '@fontsource/inter/500.css';
import '@fontsource/inter/600.css';
import '@fontsource/inter/700.css';
import '@fontsource/jetbrains-mono/400.css';
import '@fontsource/jetbrains-mono/500.css';
import './styles/index.css';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { RouterProvider } from 'react-router-dom';
import { AppProvider } from './app/provider';
import { createAppRouter } from './app/router';
import { paths } from './app/paths';
import { createQueryClient } from './lib/query-client';

// The router needs the query client (loaders warm its cache) and the query client needs to send a
// lost session to sign-in: the callback reads the router once both exist.
let router: ReturnType<typeof createAppRouter> | undefined;
const queryClient = createQueryClient({
  onUnauthenticated: () => {
    const here = window.location.pathname + window.location.search;
    if (here.startsWith(paths.signIn)) return;
    void router?.navigate(`${paths.signIn}?next=${encodeURIComponent(here)}`);
  },
});
router = createAppRouter(queryClient);

const root = document.getElementById('root');
if (!root) throw new Error('index.html lacks the #root element');
createRoot(root).render(
  <StrictMode>
    <AppProvider queryClient={queryClient}>
      <RouterProvider router={router} />
    </AppProvider>
  </StrictMode>,
);
