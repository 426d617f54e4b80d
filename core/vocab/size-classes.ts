/**
 * Body-size classes 1 to 6 for specimens identified only to size ("size 3 long bone").
 * Live-weight bands after Brain 1981 (The Hunters or the Hunted?, classes I-IV for
 * bovids) as extended by Bunn 1982 (classes V and VI); the bands are from memory, and
 * labs draw them slightly differently. Examples are common practice.
 */
export interface SizeClass {
  sizeClass: number;
  /** Adult live weight in kg, lower and upper bound (upper null: no bound). */
  minKg: number;
  maxKg: number | null;
  examples: string;
}

export const SIZE_CLASSES: readonly SizeClass[] = [
  { sizeClass: 1, minKg: 0, maxKg: 23, examples: 'hare, fox, roe deer' },
  { sizeClass: 2, minKg: 23, maxKg: 84, examples: 'sheep, goat, fallow deer, wolf' },
  { sizeClass: 3, minKg: 84, maxKg: 296, examples: 'red deer, reindeer, wild boar' },
  { sizeClass: 4, minKg: 296, maxKg: 900, examples: 'cattle, bison, horse, moose' },
  { sizeClass: 5, minKg: 900, maxKg: 3000, examples: 'woolly rhinoceros' },
  { sizeClass: 6, minKg: 3000, maxKg: null, examples: 'mammoth, mastodon' },
];

const ROMAN: Record<string, number> = { i: 1, ii: 2, iii: 3, iv: 4, v: 5, vi: 6 };

/** "3", "III", "size 3", "sc3", "class iii" -> 3; undefined when it is not a class 1-6. */
export function parseSizeClass(text: string): number | undefined {
  const t = text.trim().toLowerCase().replace(/^(size\s*class|size|class|sc|s)\s*/, '').trim();
  if (/^[1-6]$/.test(t)) return Number(t);
  return ROMAN[t];
}
