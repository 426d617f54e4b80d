import type { HierarchyNode } from './hierarchy';

/**
 * Taxa as a hierarchy with ranks: the common large and medium mammals of European and
 * North American Pleistocene and Holocene faunas, and the groups above them.
 *
 * Source of names and placement: Wilson, D. E. & Reeder, D. M. (eds) 2005, Mammal Species of
 * the World, 3rd ed. (Johns Hopkins University Press), from memory; domestic forms keep
 * their customary zooarchaeological names (Bos taurus, Ovis aries, Capra hircus, Canis
 * familiaris, Equus caballus). "Ovis/Capra" (sheep or goat, often not separable on
 * fragments) is the tribe Caprini. Typical body-size classes (see size-classes.ts) are
 * from memory and only a hint; the specimen's own size class is what is recorded.
 */

export const TAXON_RANKS = ['subphylum', 'class', 'order', 'family', 'subfamily', 'tribe', 'genus', 'species'] as const;
export type TaxonRank = (typeof TAXON_RANKS)[number];

/** Groups whose skeletons are counted alike (element counts per skeleton, skeleton-counts.ts). */
export const SKELETON_GROUPS = ['cervid', 'bovid', 'suid', 'equid', 'carnivore', 'lagomorph'] as const;
export type SkeletonGroup = (typeof SKELETON_GROUPS)[number];

export interface TaxonNode extends HierarchyNode {
  rank: TaxonRank;
  /** Typical body-size class 1-6 of an adult (from memory; a hint, not an observation). */
  sizeClass?: number;
  /** Set on the group's top taxon; members inherit it. */
  skeletonGroup?: SkeletonGroup;
  /** Where a user-added taxon came from (undefined for built-in ones). */
  addedBy?: string;
}

type Row = [name: string, rank: TaxonRank, parent: string | null, synonyms: string[], sizeClass?: number, group?: SkeletonGroup];

const rows: Row[] = [
  ['Vertebrata', 'subphylum', null, ['vertebrate', 'vert indet']],
  ['Mammalia', 'class', 'Vertebrata', ['mammal', 'mamm', 'mammal indet']],
  ['Aves', 'class', 'Vertebrata', ['bird']],

  // Even-toed ungulates
  ['Artiodactyla', 'order', 'Mammalia', ['artiodactyl', 'even-toed ungulate']],
  ['Cervidae', 'family', 'Artiodactyla', ['deer', 'cervid'], undefined, 'cervid'],
  ['Cervus', 'genus', 'Cervidae', ['cervus sp']],
  ['Cervus elaphus', 'species', 'Cervus', ['red deer', 'c elaphus'], 3],
  ['Cervus canadensis', 'species', 'Cervus', ['wapiti', 'american elk'], 4],
  ['Dama', 'genus', 'Cervidae', []],
  ['Dama dama', 'species', 'Dama', ['fallow deer'], 2],
  ['Capreolus', 'genus', 'Cervidae', []],
  ['Capreolus capreolus', 'species', 'Capreolus', ['roe deer', 'roe'], 1],
  ['Alces', 'genus', 'Cervidae', []],
  ['Alces alces', 'species', 'Alces', ['moose', 'eurasian elk'], 4],
  ['Rangifer', 'genus', 'Cervidae', []],
  ['Rangifer tarandus', 'species', 'Rangifer', ['reindeer', 'caribou'], 3],
  ['Odocoileus', 'genus', 'Cervidae', []],
  ['Odocoileus virginianus', 'species', 'Odocoileus', ['white-tailed deer', 'whitetail'], 2],
  ['Odocoileus hemionus', 'species', 'Odocoileus', ['mule deer'], 2],
  ['Megaloceros', 'genus', 'Cervidae', []],
  ['Megaloceros giganteus', 'species', 'Megaloceros', ['giant deer', 'irish elk'], 4],

  ['Bovidae', 'family', 'Artiodactyla', ['bovid'], undefined, 'bovid'],
  ['Bovinae', 'subfamily', 'Bovidae', ['bovine', 'large bovid', 'bos/bison']],
  ['Bos', 'genus', 'Bovinae', []],
  ['Bos taurus', 'species', 'Bos', ['cattle', 'cow', 'domestic cattle'], 4],
  ['Bos primigenius', 'species', 'Bos', ['aurochs'], 4],
  ['Bison', 'genus', 'Bovinae', []],
  ['Bison bison', 'species', 'Bison', ['american bison', 'buffalo'], 4],
  ['Bison priscus', 'species', 'Bison', ['steppe bison'], 4],
  ['Bison bonasus', 'species', 'Bison', ['wisent', 'european bison'], 4],
  ['Caprinae', 'subfamily', 'Bovidae', ['caprine', 'small bovid']],
  ['Caprini', 'tribe', 'Caprinae', ['ovis/capra', 'ovis capra', 'sheep/goat', 'sheep goat', 'ovicaprid', 'ovicaprine', 'o/c', 'o c']],
  ['Ovis', 'genus', 'Caprini', []],
  ['Ovis aries', 'species', 'Ovis', ['sheep', 'domestic sheep'], 2],
  ['Ovis canadensis', 'species', 'Ovis', ['bighorn sheep', 'bighorn'], 2],
  ['Capra', 'genus', 'Caprini', []],
  ['Capra hircus', 'species', 'Capra', ['goat', 'domestic goat'], 2],
  ['Capra ibex', 'species', 'Capra', ['ibex', 'alpine ibex'], 2],
  ['Rupicapra', 'genus', 'Caprinae', []],
  ['Rupicapra rupicapra', 'species', 'Rupicapra', ['chamois'], 2],
  ['Ovibos', 'genus', 'Caprinae', []],
  ['Ovibos moschatus', 'species', 'Ovibos', ['musk ox', 'muskox'], 3],
  ['Oreamnos', 'genus', 'Caprinae', []],
  ['Oreamnos americanus', 'species', 'Oreamnos', ['mountain goat'], 2],
  ['Antilocapridae', 'family', 'Artiodactyla', [], undefined, 'bovid'],
  ['Antilocapra', 'genus', 'Antilocapridae', []],
  ['Antilocapra americana', 'species', 'Antilocapra', ['pronghorn'], 2],

  ['Suidae', 'family', 'Artiodactyla', ['suid'], undefined, 'suid'],
  ['Sus', 'genus', 'Suidae', []],
  ['Sus scrofa', 'species', 'Sus', ['pig', 'wild boar', 'boar', 'domestic pig', 'sus domesticus'], 3],

  // Odd-toed ungulates
  ['Perissodactyla', 'order', 'Mammalia', ['perissodactyl', 'odd-toed ungulate']],
  ['Equidae', 'family', 'Perissodactyla', ['equid'], undefined, 'equid'],
  ['Equus', 'genus', 'Equidae', ['equus sp']],
  ['Equus caballus', 'species', 'Equus', ['horse', 'domestic horse'], 4],
  ['Equus ferus', 'species', 'Equus', ['wild horse'], 4],
  ['Equus hydruntinus', 'species', 'Equus', ['european wild ass'], 3],
  ['Equus asinus', 'species', 'Equus', ['donkey', 'ass'], 3],
  ['Rhinocerotidae', 'family', 'Perissodactyla', ['rhinoceros', 'rhino']],
  ['Coelodonta', 'genus', 'Rhinocerotidae', []],
  ['Coelodonta antiquitatis', 'species', 'Coelodonta', ['woolly rhinoceros', 'woolly rhino'], 5],

  // Proboscideans
  ['Proboscidea', 'order', 'Mammalia', ['proboscidean']],
  ['Elephantidae', 'family', 'Proboscidea', ['elephant']],
  ['Mammuthus', 'genus', 'Elephantidae', ['mammoth']],
  ['Mammuthus primigenius', 'species', 'Mammuthus', ['woolly mammoth'], 6],
  ['Mammutidae', 'family', 'Proboscidea', []],
  ['Mammut', 'genus', 'Mammutidae', ['mastodon']],
  ['Mammut americanum', 'species', 'Mammut', ['american mastodon'], 6],

  // Carnivores
  ['Carnivora', 'order', 'Mammalia', ['carnivore'], undefined, 'carnivore'],
  ['Canidae', 'family', 'Carnivora', ['canid']],
  ['Canis', 'genus', 'Canidae', []],
  ['Canis lupus', 'species', 'Canis', ['wolf', 'grey wolf', 'gray wolf'], 2],
  ['Canis familiaris', 'species', 'Canis', ['dog', 'domestic dog', 'canis lupus familiaris'], 2],
  ['Canis latrans', 'species', 'Canis', ['coyote'], 1],
  ['Vulpes', 'genus', 'Canidae', ['fox']],
  ['Vulpes vulpes', 'species', 'Vulpes', ['red fox'], 1],
  ['Vulpes lagopus', 'species', 'Vulpes', ['arctic fox', 'alopex lagopus'], 1],
  ['Ursidae', 'family', 'Carnivora', ['bear', 'ursid']],
  ['Ursus', 'genus', 'Ursidae', []],
  ['Ursus arctos', 'species', 'Ursus', ['brown bear', 'grizzly bear'], 3],
  ['Ursus spelaeus', 'species', 'Ursus', ['cave bear'], 4],
  ['Ursus americanus', 'species', 'Ursus', ['black bear', 'american black bear'], 3],
  ['Felidae', 'family', 'Carnivora', ['felid', 'cat']],
  ['Panthera', 'genus', 'Felidae', []],
  ['Panthera spelaea', 'species', 'Panthera', ['cave lion'], 3],
  ['Panthera leo', 'species', 'Panthera', ['lion'], 3],
  ['Lynx', 'genus', 'Felidae', []],
  ['Lynx lynx', 'species', 'Lynx', ['eurasian lynx'], 1],
  ['Lynx rufus', 'species', 'Lynx', ['bobcat'], 1],
  ['Felis', 'genus', 'Felidae', []],
  ['Felis silvestris', 'species', 'Felis', ['wildcat', 'wild cat', 'domestic cat', 'felis catus'], 1],
  ['Puma', 'genus', 'Felidae', []],
  ['Puma concolor', 'species', 'Puma', ['puma', 'cougar', 'mountain lion'], 2],
  ['Hyaenidae', 'family', 'Carnivora', ['hyena', 'hyaena']],
  ['Crocuta', 'genus', 'Hyaenidae', []],
  ['Crocuta crocuta', 'species', 'Crocuta', ['spotted hyena', 'cave hyena', 'crocuta spelaea'], 2],
  ['Mustelidae', 'family', 'Carnivora', ['mustelid']],
  ['Meles', 'genus', 'Mustelidae', []],
  ['Meles meles', 'species', 'Meles', ['badger', 'european badger'], 1],
  ['Gulo', 'genus', 'Mustelidae', []],
  ['Gulo gulo', 'species', 'Gulo', ['wolverine'], 1],
  ['Lutra', 'genus', 'Mustelidae', []],
  ['Lutra lutra', 'species', 'Lutra', ['otter', 'eurasian otter'], 1],
  ['Procyonidae', 'family', 'Carnivora', []],
  ['Procyon', 'genus', 'Procyonidae', []],
  ['Procyon lotor', 'species', 'Procyon', ['raccoon'], 1],

  // Hares and rabbits
  ['Lagomorpha', 'order', 'Mammalia', ['lagomorph'], undefined, 'lagomorph'],
  ['Leporidae', 'family', 'Lagomorpha', ['leporid', 'hare/rabbit']],
  ['Lepus', 'genus', 'Leporidae', ['hare']],
  ['Lepus europaeus', 'species', 'Lepus', ['brown hare', 'european hare'], 1],
  ['Lepus timidus', 'species', 'Lepus', ['mountain hare', 'arctic hare'], 1],
  ['Lepus americanus', 'species', 'Lepus', ['snowshoe hare'], 1],
  ['Oryctolagus', 'genus', 'Leporidae', []],
  ['Oryctolagus cuniculus', 'species', 'Oryctolagus', ['rabbit', 'european rabbit'], 1],
  ['Sylvilagus', 'genus', 'Leporidae', ['cottontail']],
  ['Sylvilagus floridanus', 'species', 'Sylvilagus', ['eastern cottontail'], 1],

  // Rodents large enough to be catalogued routinely
  ['Rodentia', 'order', 'Mammalia', ['rodent']],
  ['Castoridae', 'family', 'Rodentia', []],
  ['Castor', 'genus', 'Castoridae', ['beaver']],
  ['Castor fiber', 'species', 'Castor', ['eurasian beaver'], 1],
  ['Castor canadensis', 'species', 'Castor', ['american beaver', 'north american beaver'], 1],
  ['Sciuridae', 'family', 'Rodentia', []],
  ['Marmota', 'genus', 'Sciuridae', ['marmot']],
  ['Marmota marmota', 'species', 'Marmota', ['alpine marmot'], 1],
];

export const BUILT_IN_TAXA: readonly TaxonNode[] = rows.map(([name, rank, parent, synonyms, sizeClass, group]) => ({
  name,
  rank,
  parent,
  synonyms,
  ...(sizeClass !== undefined ? { sizeClass } : {}),
  ...(group !== undefined ? { skeletonGroup: group } : {}),
}));
