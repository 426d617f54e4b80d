import { useState } from 'react';
import type { ApiClient, ShellSession } from '../api/client';
import { Problems } from '../app/Problems';
import type { ThemeName } from '../app/theme';

/**
 * The first screen: what to keep in mind before working with proposed joins, and where to
 * start (the demo assemblage, a catalogue on disk, or a new one).
 */
export function FirstRun(props: {
  client: ApiClient;
  session: ShellSession;
  current: string | null;
  onOpen: (path: string) => void;
  theme: ThemeName;
  onTheme: (t: ThemeName) => void;
}) {
  const { client, session } = props;
  const [path, setPath] = useState(props.current ?? '');
  const [newPath, setNewPath] = useState('');
  const [error, setError] = useState<unknown>(null);
  const [busy, setBusy] = useState(false);
  const canCreate = session.requests.some((r) => r.name === 'catalogue.init');

  async function pick(purpose: 'open-catalogue' | 'new-catalogue', set: (p: string) => void): Promise<void> {
    const chosen = await client.pickFile?.(purpose);
    if (chosen) set(chosen);
  }

  async function create(): Promise<void> {
    setBusy(true);
    setError(null);
    try {
      await (client.call as (n: string, i: unknown) => Promise<unknown>)('catalogue.init', { catalogue: newPath.trim() });
      props.onOpen(newPath.trim());
    } catch (err) {
      setError(err);
    } finally {
      setBusy(false);
    }
  }

  return (
    <main className="first-run">
      <header>
        <h1>
          <span className="mark" aria-hidden="true" /> knitbone
        </h1>
        <p className="lede">A catalogue, refit finder and counter for an assemblage of animal bone.</p>
        <button type="button" className="quiet" onClick={() => props.onTheme(props.theme === 'light' ? 'dark' : 'light')}>
          {props.theme === 'light' ? 'Dark theme' : 'Light theme'}
        </button>
      </header>

      <section className="cautions" aria-labelledby="cautions-title">
        <h2 id="cautions-title">Before you begin</h2>
        <ul>
          <li>
            <strong>Proposed joins are hypotheses.</strong> knitbone compares scans and suggests fragments that may fit.
            Check every proposal on the physical specimens before you accept it.
          </li>
          <li>
            <strong>Never glue or alter a specimen because the program proposed a join.</strong> Break surfaces carry
            evidence; handle them as your lab's conservation rules say.
          </li>
          <li>
            <strong>Possible human remains</strong> are handled under local law and the wishes of descendant
            communities. Stop, set them aside and follow your institution's procedure.
          </li>
        </ul>
      </section>

      <section className="openers" aria-label="Open an assemblage">
        {session.demoCatalogue && (
          <div className="opener">
            <h2>Demo assemblage</h2>
            <p>An invented site with scanned fragments, for trying every screen without touching real data.</p>
            <button type="button" className="primary" onClick={() => props.onOpen(session.demoCatalogue!)}>
              Open the demo assemblage
            </button>
          </div>
        )}
        <form
          className="opener"
          onSubmit={(e) => {
            e.preventDefault();
            if (path.trim()) props.onOpen(path.trim());
          }}
        >
          <h2>A catalogue on this computer</h2>
          <label htmlFor="open-path">Catalogue file (.sqlite)</label>
          <div className="row">
            <input id="open-path" value={path} onChange={(e) => setPath(e.target.value)} placeholder="path/to/assemblage.sqlite" />
            {session.canPickFiles && (
              <button type="button" onClick={() => void pick('open-catalogue', setPath)}>
                Browse...
              </button>
            )}
          </div>
          <button type="submit" className={session.demoCatalogue ? '' : 'primary'} disabled={!path.trim()}>
            Open catalogue
          </button>
          {session.recent.length > 0 && (
            <>
              <h3>Recent</h3>
              <ul className="recent">
                {session.recent.map((r) => (
                  <li key={r}>
                    <button type="button" className="link" onClick={() => props.onOpen(r)}>
                      {r}
                    </button>
                  </li>
                ))}
              </ul>
            </>
          )}
        </form>
        {canCreate && (
          <form
            className="opener"
            onSubmit={(e) => {
              e.preventDefault();
              if (newPath.trim()) void create();
            }}
          >
            <h2>A new assemblage</h2>
            <label htmlFor="new-path">New catalogue file</label>
            <div className="row">
              <input id="new-path" value={newPath} onChange={(e) => setNewPath(e.target.value)} placeholder="path/to/new.sqlite" />
              {session.canPickFiles && (
                <button type="button" onClick={() => void pick('new-catalogue', setNewPath)}>
                  Browse...
                </button>
              )}
            </div>
            <button type="submit" disabled={!newPath.trim() || busy}>
              Create catalogue
            </button>
          </form>
        )}
      </section>
      <Problems error={error} />
    </main>
  );
}
