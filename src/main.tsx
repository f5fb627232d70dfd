import '@fontsource-variable/ibm-plex-sans';
import '@fontsource/ibm-plex-mono/400.css';
import '@fontsource/ibm-plex-mono/500.css';
import './styles.css';
import { createRoot } from 'react-dom/client';
import { AppProviders } from './app/providers.js';
import { createQueryClient } from './app/query-client.js';
import { createAppRouter } from './app/router.js';
import { configureApiClient, signInPath } from './lib/api-client.js';
import { authKeys } from './features/auth/api/keys.js';

const queryClient = createQueryClient();
const router = createAppRouter(queryClient);

// An expired session met mid-use: forget who we thought was signed in and go to sign-in,
// coming back to the same screen afterwards.
configureApiClient({
  onUnauthorized: () => {
    const { pathname, search } = router.state.location;
    if (pathname === '/sign-in') return;
    queryClient.setQueryData(authKeys.me(), null);
    void router.navigate(signInPath(`${pathname}${search}`), { replace: true });
  },
});

createRoot(document.getElementById('root')!).render(<AppProviders queryClient={queryClient} router={router} />);
