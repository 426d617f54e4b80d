/**
 * What the matcher studies (fine-step-study.ts, propose-profile.ts, screen-stages.ts,
 * screen-prerank-study.ts) read from a generated folder: its scans as the analysis cache holds
 * them, the run's sample spacing, and the candidate face pairs a propose run would align.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { byFragmentPair, candidateFacePairs, DEFAULT_K, type FacePairCandidate, type IndexedFace } from '../../core/geometry/proposals/candidate-index';
import { faceTraits } from '../../core/geometry/proposals/face-traits';
import { runSpacing, type FragmentInput, type PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { loadCached } from './pairwise.bench';

/** The folder's scans that the analysis accepts (refused scans take no part), their catalogue numbers in the same order, and the run's spacing. */
export function readStudyScans(dir: string): { nos: string[]; inputs: FragmentInput[]; spacing: number } {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { fragments: Array<{ catalogueNo: string }> };
  const nos: string[] = [], inputs: FragmentInput[] = [];
  for (const { catalogueNo: no } of truth.fragments) {
    try {
      inputs.push(loadCached(join(dir, 'scans', `${no}.ply`)));
      nos.push(no);
    } catch {
      // refused scans take no part
    }
  }
  return { nos, inputs, spacing: runSpacing(inputs.flatMap((x) => x.faces.map((f) => f.area ?? 0))) };
}

/** The candidate face pairs of prepared fragments (k = DEFAULT_K, no size classes), grouped by fragment pair. */
export function candidateGroups(prepared: PreparedFragment[]): FacePairCandidate[][] {
  const faces: IndexedFace[] = [];
  prepared.forEach((p, fi) => {
    const axis = p.axis ? { direction: p.axis.direction, point: p.axis.point, support: 1 } : undefined;
    p.faces.forEach((x, face) => faces.push({ fragment: fi, face, traits: faceTraits(x.points, x.normals, x.area, x.fpfh, axis) }));
  });
  return [...byFragmentPair(candidateFacePairs(faces, { k: DEFAULT_K })).values()];
}
