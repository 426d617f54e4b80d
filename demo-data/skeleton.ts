/**
 * The long bones the generator knows, for a deer-sized and a cattle-sized animal, as shape
 * parameters in millimetres. The figures are rough adult proportions given from memory (not
 * measured from specimens): enough for an analyst to recognise a long bone and its size class,
 * not anatomical copies.
 */

export interface EndSpec {
  /** Length (mm) of the swollen end, from the tip inwards. */
  length: number;
  /** Mean radius of the end (mm). */
  radius: number;
  /** cos(2θ) and cos(4θ) coefficients: a wide end (2) and two condyles (4). */
  lobe2: number;
  lobe4: number;
  /** Angle (radians) of the lobes' long direction. */
  phase: number;
  /** Sideways shift (mm) of the end's centre against the shaft axis, e.g. an offset head. */
  offset: readonly [number, number];
  /** How far (mm) the rounded cap reaches beyond the end: small for a flat articular plateau. */
  cap: number;
}

export interface ElementSpec {
  taxon: string;
  /** Family, as an analyst records a fragment identified only that far. */
  family: string;
  /** Body-size class of the animal (1 smallest .. 6 largest). */
  sizeClass: number;
  element: string;
  length: number;
  /** Mean outer shaft radius at 20 %, 50 % and 80 % of the length (mm). */
  shaft: readonly [number, number, number];
  /** Cortical wall thickness at 20 %, 50 % and 80 % (mm). */
  cortical: readonly [number, number, number];
  /** Cross-section: cos(2θ) (flattening) and cos(3θ) (a triangular shaft, as the tibia). */
  oval: number;
  tri: number;
  /** A slow change of the cross-section along the shaft (default 0.03). */
  wobble?: number;
  /** Sagitta (mm) of the gentle bow of the shaft. */
  bow: number;
  proximal: EndSpec;
  distal: EndSpec;
}

const end = (
  length: number,
  radius: number,
  lobe2: number,
  lobe4: number,
  cap: number,
  offset: readonly [number, number] = [0, 0],
  phase = 0,
): EndSpec => ({ length, radius, lobe2, lobe4, phase, offset, cap });

const deer = { taxon: 'Cervus elaphus', family: 'Cervidae', sizeClass: 3 } as const;
const cattle = { taxon: 'Bos taurus', family: 'Bovidae', sizeClass: 4 } as const;

export const ELEMENTS: readonly ElementSpec[] = [
  // deer-sized (red deer)
  { ...deer, element: 'femur', length: 250, shaft: [14, 12, 13.5], cortical: [3.5, 4.5, 3.8], oval: 0.06, tri: 0.02, bow: 6,
    proximal: end(48, 27, 0.28, 0.06, 16, [5, 0]), distal: end(52, 25, 0.12, 0.1, 16, [0, 3], Math.PI / 2) },
  { ...deer, element: 'tibia', length: 300, shaft: [15, 11.5, 12], cortical: [3.8, 5, 4.2], oval: 0.05, tri: 0.13, bow: 4,
    proximal: end(58, 29, 0.2, 0.08, 10, [0, 2]), distal: end(36, 19, 0.16, 0.05, 9) },
  { ...deer, element: 'humerus', length: 230, shaft: [15, 12, 14], cortical: [3.5, 4.5, 3.8], oval: 0.08, tri: 0.04, bow: 5,
    proximal: end(46, 27, 0.12, 0.04, 20, [0, 5]), distal: end(40, 23, 0.3, 0.1, 13, [0, -2]) },
  { ...deer, element: 'radius', length: 250, shaft: [11, 10, 12], cortical: [3.2, 3.8, 3.4], oval: 0.3, tri: 0.02, bow: 6,
    proximal: end(28, 17, 0.36, 0.03, 8), distal: end(34, 19, 0.3, 0.05, 9) },
  { ...deer, element: 'metatarsal', length: 270, shaft: [10.5, 10, 11], cortical: [3.8, 4.5, 4], oval: 0.1, tri: 0.03, bow: 2,
    proximal: end(24, 15, 0.12, 0.03, 6), distal: end(34, 17, 0.28, 0.16, 12) },
  // cattle-sized
  { ...cattle, element: 'femur', length: 380, shaft: [22, 19, 21.5], cortical: [6.5, 9, 7], oval: 0.06, tri: 0.02, bow: 8,
    proximal: end(70, 43, 0.3, 0.06, 24, [8, 0]), distal: end(75, 40, 0.12, 0.1, 24, [0, 4], Math.PI / 2) },
  { ...cattle, element: 'tibia', length: 360, shaft: [24, 18, 19], cortical: [7.5, 11, 8.5], oval: 0.05, tri: 0.13, bow: 5,
    proximal: end(70, 44, 0.22, 0.08, 15, [0, 3]), distal: end(48, 29, 0.16, 0.05, 13) },
  { ...cattle, element: 'humerus', length: 300, shaft: [22, 19, 21], cortical: [6.5, 9, 7], oval: 0.08, tri: 0.04, bow: 7,
    proximal: end(64, 42, 0.12, 0.04, 28, [0, 7]), distal: end(55, 35, 0.3, 0.1, 18, [0, -3]) },
  { ...cattle, element: 'radius', length: 290, shaft: [20, 17, 20], cortical: [6, 8, 6.5], oval: 0.3, tri: 0.02, bow: 7,
    proximal: end(36, 27, 0.36, 0.03, 11), distal: end(44, 30, 0.3, 0.05, 13) },
  { ...cattle, element: 'metacarpal', length: 200, shaft: [19, 16.5, 18.5], cortical: [7, 9, 7.5], oval: 0.26, tri: 0.02, bow: 2,
    proximal: end(28, 27, 0.25, 0.04, 8), distal: end(40, 30, 0.3, 0.16, 15) },
];
