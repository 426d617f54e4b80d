import { useEffect, useState } from 'react';
import { callByName } from '../api/loose';
import { useWorkspace } from '../app/workspace';
import { decodeMesh, type MeshPayload, type MeshView } from './mesh-payload';

/** The host request that sends a specimen's scan (with its faces) to the viewer. */
export const MESH_REQUEST = 'viewer.mesh';

/**
 * The scan of a specimen as the viewer needs it; null while loading or when there is none.
 * A new `refresh` value asks again (after the analyst corrected a region, say); the mesh
 * drawn so far stays until the new one arrives.
 */
export function useScanMesh(specimenId: number | null, refresh = 0): { mesh: MeshView | null; error: unknown; available: boolean; loading: boolean } {
  const ws = useWorkspace();
  const available = ws.has(MESH_REQUEST);
  const [mesh, setMesh] = useState<MeshView | null>(null);
  const [error, setError] = useState<unknown>(null);
  const [loading, setLoading] = useState(false);
  const [shownFor, setShownFor] = useState<number | null>(null);
  useEffect(() => {
    if (specimenId !== shownFor) setMesh(null);
    setError(null);
    if (!available || specimenId === null) return;
    let live = true;
    setLoading(true);
    callByName<MeshPayload | null>(ws.client, MESH_REQUEST, { catalogue: ws.catalogue, specimenId })
      .then((p) => {
        if (!live) return;
        performance.mark('knitbone:scan-received');
        setMesh(p ? decodeMesh(p) : null);
        setShownFor(specimenId);
      })
      .catch((e) => live && setError(e))
      .finally(() => live && setLoading(false));
    return () => {
      live = false;
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [ws.client, ws.catalogue, specimenId, available, refresh]);
  return { mesh, error, available, loading };
}
