/**
 * `proposals.match`: two scan files in, the best join between them out (issue 6, item 1), in
 * the shape `knitbone match --json` prints. A pair with no plausible join gets its best (low)
 * score, or score 0 and no transform when no alignment was found at all.
 */
import { KnitboneError } from '../errors';
import type { RequestContext } from '../request';
import { matchFragments, DEFAULT_MATCH_PARAMETERS, type FaceMatch } from '../../geometry/proposals/pairwise-match';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment, spacingForFaces } from '../../geometry/proposals/prepared-fragment';
import { contentHashOf, loadFragment, readScanBytes, type LengthUnit } from '../../jobs/fragment-loader';

export interface MatchSummary {
  score: number;
  transform: number[] | null;
  faceA: number | null;
  faceB: number | null;
  contactFraction: number;
  gapRmsMm: number | null;
  penetrationMm: number | null;
  outlineAgreement: number;
}

export interface MatchOutput extends MatchSummary {
  candidates: MatchSummary[];
}

export function summarise(m: FaceMatch): MatchSummary {
  return {
    score: round(m.score, 4),
    transform: m.transform.map((v) => round(v, 6)),
    faceA: m.faceA,
    faceB: m.faceB,
    contactFraction: round(m.contactFraction, 4),
    gapRmsMm: round(m.gapRmsMm, 4),
    penetrationMm: round(m.penetrationMm, 4),
    outlineAgreement: round(m.outlineAgreement, 4),
  };
}

function round(v: number, d: number): number {
  const f = 10 ** d;
  return Math.round(v * f) / f;
}

export function matchScanFiles(
  input: { a: string; b: string; unitsA: LengthUnit; unitsB: LengthUnit; alternatives: number },
  ctx: RequestContext,
): MatchOutput {
  const bytesA = readScanBytes(input.a);
  const bytesB = readScanBytes(input.b);
  if (contentHashOf(bytesA) === contentHashOf(bytesB)) {
    throw new KnitboneError('bad-input', [{ file: input.b, message: `is the same scan as ${input.a} (identical content); a fragment cannot join itself` }]);
  }
  ctx.onProgress({ stage: 'analysing scans', done: 0, total: 3 });
  const A = loadFragment(input.a, input.unitsA, bytesA);
  ctx.onProgress({ stage: 'analysing scans', done: 1, total: 3 });
  const B = loadFragment(input.b, input.unitsB, bytesB);
  if (sameGeometry(A.input.positions, B.input.positions)) {
    throw new KnitboneError('bad-input', [{ file: input.b, message: `holds the same surface as ${input.a}; a fragment cannot join itself` }]);
  }
  ctx.onProgress({ stage: 'aligning break faces', done: 2, total: 3 });
  const spacing = spacingForFaces([...A.input.faces, ...B.input.faces].map((f) => f.area ?? 0));
  const sampling = { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS };
  const pa = prepareFragment(A.input, sampling);
  const pb = prepareFragment(B.input, sampling);
  const matches = matchFragments(pa, pb, DEFAULT_MATCH_PARAMETERS);
  ctx.onProgress({ stage: 'aligning break faces', done: 3, total: 3 });
  const [best, ...rest] = matches;
  if (!best) {
    return { score: 0, transform: null, faceA: null, faceB: null, contactFraction: 0, gapRmsMm: null, penetrationMm: null, outlineAgreement: 0, candidates: [] };
  }
  return { ...summarise(best), candidates: rest.slice(0, input.alternatives).map(summarise) };
}

function sameGeometry(a: Float32Array, b: Float32Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}
