import type { HierarchyNode } from './hierarchy';

/**
 * Skeletal elements as a hierarchy, from "bone" (any bone, unidentified) through categories
 * an analyst can still tell on a fragment ("long bone", "upper limb long bone", "vertebra")
 * down to specific elements ("femur", "astragalus").
 *
 * The long-bone grouping into upper (humerus, femur), intermediate (radius, ulna, tibia)
 * and lower (metapodials) limb bones follows the limb-segment categories used for shaft
 * fragments by Bunn 1982 and Marean & Spencer 1991 (from memory). Anatomical names follow
 * standard veterinary usage (Getty 1975, Sisson and Grossman's The Anatomy of the
 * Domestic Animals, 5th ed.), from memory.
 */
export interface ElementNode extends HierarchyNode {
  /** A specific element (countable, e.g. "femur"), or a category ("long bone"). */
  specific: boolean;
  /** Left and right exist (limb bones, scapula, pelvis, mandible, ribs, teeth); otherwise axial. */
  paired: boolean;
  /** Where a user-added element came from (undefined for built-in ones). */
  addedBy?: string;
}

type Row = [name: string, parent: string | null, kind: 'category' | 'paired' | 'axial', synonyms: string[]];

const rows: Row[] = [
  ['bone', null, 'category', ['indeterminate', 'indet', 'ind', 'unidentified', 'unid', 'bone fragment', 'fragment', 'nid']],

  ['long bone', 'bone', 'category', ['lb', 'long bone fragment', 'long bone shaft', 'lbsf', 'shaft fragment', 'limb bone']],
  ['upper limb long bone', 'long bone', 'category', ['upper limb bone', 'ulb', 'upper limb']],
  ['humerus', 'upper limb long bone', 'paired', ['hum', 'hu', 'humeri']],
  ['femur', 'upper limb long bone', 'paired', ['fem', 'fe', 'femora']],
  ['intermediate limb long bone', 'long bone', 'category', ['intermediate limb bone', 'ilb', 'intermediate limb', 'mid limb bone']],
  ['radius', 'intermediate limb long bone', 'paired', ['rad', 'ra', 'radii']],
  ['ulna', 'intermediate limb long bone', 'paired', ['uln', 'ul', 'ulnae']],
  ['tibia', 'intermediate limb long bone', 'paired', ['tib', 'ti', 'tibiae']],
  ['fibula', 'intermediate limb long bone', 'paired', ['fib', 'lateral malleolus', 'malleolar bone']],
  ['lower limb long bone', 'long bone', 'category', ['lower limb bone', 'llb', 'lower limb']],
  ['metapodial', 'lower limb long bone', 'category', ['metapodium', 'mp', 'mtp', 'metapodials']],
  ['metacarpal', 'metapodial', 'paired', ['mc', 'metacarpus', 'mcp', 'cannon bone (fore)']],
  ['metatarsal', 'metapodial', 'paired', ['mt', 'metatarsus', 'mtt', 'cannon bone (hind)']],

  ['head', 'bone', 'category', ['cranial', 'skull fragment', 'head bone']],
  ['cranium', 'head', 'axial', ['skull', 'crn', 'cra', 'neurocranium']],
  ['mandible', 'head', 'paired', ['mand', 'mnd', 'dentary', 'hemimandible', 'jaw', 'lower jaw']],
  ['horn core', 'head', 'paired', ['hc', 'horncore']],
  ['antler', 'head', 'paired', ['ant']],
  ['hyoid', 'head', 'paired', ['hyo', 'stylohyoid']],
  ['tooth', 'head', 'category', ['teeth', 'dent', 'tth', 'loose tooth']],
  ['incisor', 'tooth', 'paired', ['inc']],
  ['canine', 'tooth', 'paired', ['can', 'tusk']],
  ['premolar', 'tooth', 'paired', ['pm', 'premolars']],
  ['molar', 'tooth', 'paired', ['mol', 'molars']],

  ['vertebra', 'bone', 'category', ['vert', 'vertebrae']],
  ['atlas', 'vertebra', 'axial', ['c1', 'atl']],
  ['axis', 'vertebra', 'axial', ['c2', 'epistropheus']],
  ['cervical vertebra', 'vertebra', 'axial', ['cervical', 'cerv', 'cv', 'c3-c7']],
  ['thoracic vertebra', 'vertebra', 'axial', ['thoracic', 'thor', 'tv', 'th']],
  ['lumbar vertebra', 'vertebra', 'axial', ['lumbar', 'lumb', 'lv']],
  ['sacrum', 'vertebra', 'axial', ['sac', 'sacral']],
  ['caudal vertebra', 'vertebra', 'axial', ['caudal', 'caud', 'cau', 'tail vertebra']],

  ['rib', 'bone', 'paired', ['ri', 'ribs', 'costa', 'rib fragment']],
  ['sternum', 'bone', 'axial', ['sternebra', 'ster']],

  ['girdle', 'bone', 'category', ['limb girdle']],
  ['scapula', 'girdle', 'paired', ['scap', 'sca', 'sc', 'shoulder blade']],
  ['pelvis', 'girdle', 'paired', ['pel', 'innominate', 'os coxae', 'coxa', 'hip bone', 'inn']],

  ['carpal', 'bone', 'category', ['carpals', 'carp', 'carpal bone']],
  ['tarsal', 'bone', 'category', ['tarsals', 'tars', 'tarsal bone']],
  ['astragalus', 'tarsal', 'paired', ['ast', 'talus', 'astr']],
  ['calcaneus', 'tarsal', 'paired', ['cal', 'calcaneum', 'calc']],
  ['patella', 'bone', 'paired', ['pat', 'kneecap']],
  ['sesamoid', 'bone', 'category', ['ses', 'sesamoids']],

  ['phalanx', 'bone', 'category', ['phal', 'ph', 'phalanges']],
  ['first phalanx', 'phalanx', 'paired', ['phalanx 1', 'ph1', 'proximal phalanx', '1st phalanx', 'phal 1']],
  ['second phalanx', 'phalanx', 'paired', ['phalanx 2', 'ph2', 'middle phalanx', 'medial phalanx', '2nd phalanx', 'phal 2']],
  ['third phalanx', 'phalanx', 'paired', ['phalanx 3', 'ph3', 'distal phalanx', 'ungual', '3rd phalanx', 'phal 3']],
];

export const BUILT_IN_ELEMENTS: readonly ElementNode[] = rows.map(([name, parent, kind, synonyms]) => ({
  name,
  parent,
  synonyms,
  specific: kind !== 'category',
  paired: kind === 'paired',
}));

/** The category every long bone lies under; portion zones apply to it and what lies below. */
export const LONG_BONE = 'long bone';
