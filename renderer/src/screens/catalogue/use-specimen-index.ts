import { useEffect, useState } from 'react';
import { callByName } from '../../api/loose';
import { useWorkspace } from '../../app/workspace';
import type { SpecimenRecord } from './specimen-view';

/** Specimens of the open catalogue by catalogue number (joins name specimens that way). */
export function useSpecimenIndex(): Map<string, SpecimenRecord> | null {
  const ws = useWorkspace();
  const [index, setIndex] = useState<Map<string, SpecimenRecord> | null>(null);
  useEffect(() => {
    callByName<SpecimenRecord[]>(ws.client, 'specimens.list', { catalogue: ws.catalogue })
      .then((list) => setIndex(new Map(list.map((s) => [s.catalogueNo, s]))))
      .catch(() => setIndex(new Map()));
  }, [ws.client, ws.catalogue, ws.revision]);
  return index;
}
