import { useCallback, useEffect, useMemo, useState } from 'react';
import type { ApiClient, ShellSession } from '../api/client';
import { CatalogueScreen } from '../screens/catalogue/CatalogueScreen';
import { CountsScreen } from '../screens/counts/CountsScreen';
import { FirstRun } from '../screens/FirstRun';
import { RefitSetsScreen } from '../screens/refits/RefitSetsScreen';
import { ReviewScreen } from '../screens/review/ReviewScreen';
import { SiteMapScreen } from '../screens/site/SiteMapScreen';
import { SpecimenScreen } from '../screens/specimen/SpecimenScreen';
import { Problems } from './Problems';
import { applyTheme, initialTheme, type ThemeName } from './theme';
import { WorkspaceContext, type ReviewDecision, type ScreenName, type Workspace } from './workspace';

const SCREENS: Array<{ name: ScreenName; label: string; key: string }> = [
  { name: 'catalogue', label: 'Catalogue', key: '1' },
  { name: 'specimen', label: 'Specimen', key: '2' },
  { name: 'review', label: 'Proposed joins', key: '3' },
  { name: 'refits', label: 'Refit sets', key: '4' },
  { name: 'counts', label: 'Counts', key: '5' },
  { name: 'site', label: 'Site map', key: '6' },
];

const CAUTIONS_KEY = 'knitbone.cautions-read';

export function App({ client }: { client: ApiClient }) {
  const [session, setSession] = useState<ShellSession | null>(null);
  const [error, setError] = useState<unknown>(null);
  const [theme, setTheme] = useState<ThemeName>(initialTheme);
  const [catalogue, setCatalogue] = useState<string | null>(null);
  const [showStart, setShowStart] = useState(() => localStorage.getItem(CAUTIONS_KEY) !== 'yes');
  const [screen, setScreen] = useState<ScreenName>('catalogue');
  const [specimen, setSpecimen] = useState<number | null>(null);
  const [revision, setRevision] = useState(0);
  const [decisions, setDecisions] = useState<ReviewDecision[]>([]);
  const [status, setStatus] = useState<{ message: string; tone: 'info' | 'error' } | null>(null);

  useEffect(() => applyTheme(theme), [theme]);
  useEffect(() => {
    client
      .session()
      .then((s) => {
        setSession(s);
        if (s.catalogue) setCatalogue(s.catalogue);
      })
      .catch(setError);
  }, [client]);

  const open = useCallback((name: ScreenName, id?: number) => {
    if (id !== undefined) setSpecimen(id);
    setScreen(name);
  }, []);

  useEffect(() => {
    const onKey = (e: KeyboardEvent): void => {
      if (!e.altKey || e.ctrlKey || e.metaKey) return;
      const s = SCREENS.find((x) => x.key === e.key);
      if (s && catalogue && !showStart) {
        e.preventDefault();
        setScreen(s.name);
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [catalogue, showStart]);

  const workspace = useMemo<Workspace | null>(() => {
    if (!session || !catalogue) return null;
    const names = new Set(session.requests.map((r) => r.name));
    return {
      client,
      session,
      catalogue,
      revision,
      changed: () => setRevision((r) => r + 1),
      has: (name) => names.has(name),
      say: (message, tone = 'info') => setStatus({ message, tone }),
      open,
      decisions,
      setDecisions,
    };
  }, [client, session, catalogue, revision, open, decisions]);

  if (error) return <main className="fatal"><Problems error={error} /></main>;
  if (!session) return <main className="fatal" aria-busy="true">Opening knitbone...</main>;

  if (showStart || !workspace) {
    return (
      <FirstRun
        client={client}
        session={session}
        current={catalogue}
        onOpen={(path) => {
          localStorage.setItem(CAUTIONS_KEY, 'yes');
          if (path !== catalogue) setDecisions([]);
          setCatalogue(path);
          setShowStart(false);
          setScreen('catalogue');
          setRevision((r) => r + 1);
        }}
        theme={theme}
        onTheme={setTheme}
      />
    );
  }

  const name = catalogue!.split(/[\\/]/).pop();
  return (
    <WorkspaceContext.Provider value={workspace}>
      <div className="frame">
        <nav className="rail" aria-label="Screens">
          <div className="brand">
            <span className="mark" aria-hidden="true" />
            <span>knitbone</span>
          </div>
          <p className="assemblage" title={catalogue!}>
            <span className="caption">Assemblage</span>
            {name}
          </p>
          <ul>
            {SCREENS.map((s) => (
              <li key={s.name}>
                <button
                  type="button"
                  className={screen === s.name ? 'current' : ''}
                  aria-current={screen === s.name ? 'page' : undefined}
                  onClick={() => setScreen(s.name)}
                  title={`Alt+${s.key}`}
                >
                  {s.label}
                  <kbd aria-hidden="true">Alt {s.key}</kbd>
                </button>
              </li>
            ))}
          </ul>
          <div className="rail-foot">
            <button type="button" onClick={() => setTheme(theme === 'light' ? 'dark' : 'light')}>
              {theme === 'light' ? 'Dark theme' : 'Light theme'}
            </button>
            <button type="button" onClick={() => setShowStart(true)}>
              Other assemblage...
            </button>
          </div>
        </nav>
        <main className="stage" id="stage">
          {screen === 'catalogue' && <CatalogueScreen />}
          {screen === 'specimen' && <SpecimenScreen specimenId={specimen} />}
          {screen === 'review' && <ReviewScreen />}
          {screen === 'refits' && <RefitSetsScreen />}
          {screen === 'counts' && <CountsScreen />}
          {screen === 'site' && <SiteMapScreen />}
        </main>
        <footer className={`status ${status?.tone ?? ''}`} role="status" aria-live="polite">
          {status?.message ?? ''}
        </footer>
      </div>
    </WorkspaceContext.Provider>
  );
}
