/**
 * NSP, the number of specimens: every specimen, identified or not (Lyman 2008, chapter 1;
 * Grayson 1984 counts identified and unidentified specimens apart).
 */
export function numberOfSpecimens(specimens: readonly unknown[]): number {
  return specimens.length;
}
