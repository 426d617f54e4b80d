import { useEffect, useState } from 'react';
import { loadSpecimens } from '../../app/specimen-list';
import { useWorkspace } from '../../app/workspace';
import type { SpecimenRecord } from './specimen-view';

/** Specimens of the open catalogue by catalogue number (joins name specimens that way). */
export function useSpecimenIndex(): Map<string, SpecimenRecord> | null {
  const ws = useWorkspace();
  const [index, setIndex] = useState<Map<string, SpecimenRecord> | null>(null);
  useEffect(() => {
    let live = true;
    loadSpecimens(ws)
      .then((list) => live && setIndex(new Map(list.map((s) => [s.catalogueNo, s]))))
      .catch(() => live && setIndex(new Map()));
    return () => {
      live = false;
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [ws.client, ws.catalogue, ws.revision]);
  return index;
}
