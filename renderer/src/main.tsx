import { createRoot } from 'react-dom/client';
import { bridgeClient, type DesktopBridge } from './api/bridge-client';
import type { ApiClient } from './api/client';
import { loopbackClient } from './api/loopback-client';
import { App } from './app/App';
import './styles/app.css';

// The one place that looks at how the page was opened: the desktop shell's preload puts
// a bridge on window; the loopback server puts its token in a meta tag. Everything below
// App only sees an ApiClient.
function makeClient(): ApiClient | null {
  const bridge = (window as unknown as { knitboneBridge?: DesktopBridge }).knitboneBridge;
  if (bridge) return bridgeClient(bridge);
  const token = document.querySelector<HTMLMetaElement>('meta[name="knitbone-token"]')?.content;
  return token ? loopbackClient(token) : null;
}

const client = makeClient();
const root = createRoot(document.getElementById('root')!);
if (client) root.render(<App client={client} />);
else root.render(<p className="fatal">This page was opened without knitbone's key. Open the address knitbone printed when it started.</p>);
