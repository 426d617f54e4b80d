import { useEffect, useState } from 'react';
import { callByName } from '../../api/loose';
import { useWorkspace } from '../../app/workspace';
import type { Counts } from './counts-model';

export const COUNTS_REQUEST = 'tally.counts';

/** The counts of the open catalogue, fetched again whenever the catalogue changes. */
export function useCounts(): { counts: Counts | null; error: unknown; available: boolean } {
  const ws = useWorkspace();
  const available = ws.has(COUNTS_REQUEST);
  const [counts, setCounts] = useState<Counts | null>(null);
  const [error, setError] = useState<unknown>(null);
  useEffect(() => {
    if (!available) return;
    let live = true;
    callByName<Counts>(ws.client, COUNTS_REQUEST, { catalogue: ws.catalogue })
      .then((c) => {
        if (live) {
          setCounts(c);
          setError(null);
        }
      })
      .catch((e) => live && setError(e));
    return () => {
      live = false;
    };
  }, [ws.client, ws.catalogue, ws.revision, available]);
  return { counts, error, available };
}
