/**
 * Errors that cross the host API. Every problem says what was wrong, where it was
 * (file, line, column, field) and, where we can tell, what to do about it.
 *
 * kind decides how shells answer: the CLI exits 1 for 'bad-input', 'not-found',
 * 'conflict' and 'refused', and 2 for 'usage'; HTTP answers 400/404/409/403.
 */
export type ErrorKind = 'bad-input' | 'usage' | 'not-found' | 'conflict' | 'refused' | 'internal';

export interface Problem {
  /** One sentence: what is wrong and, where possible, what to do. */
  message: string;
  file?: string;
  line?: number;
  column?: string | number;
  field?: string;
}

export class KnitboneError extends Error {
  readonly kind: ErrorKind;
  readonly problems: Problem[];

  constructor(kind: ErrorKind, problems: Problem[] | string) {
    const list = typeof problems === 'string' ? [{ message: problems }] : problems;
    super(list.map(formatProblem).join('\n'));
    this.name = 'KnitboneError';
    this.kind = kind;
    this.problems = list;
  }
}

/** `file: line N, column C, field F: message`, leaving out the parts that are unknown. */
export function formatProblem(p: Problem): string {
  const where: string[] = [];
  if (p.file) where.push(p.file);
  if (p.line !== undefined) where.push(`line ${p.line}`);
  if (p.column !== undefined) where.push(`column ${p.column}`);
  if (p.field !== undefined && p.column === undefined) where.push(`field ${p.field}`);
  return where.length ? `${where.join(', ')}: ${p.message}` : p.message;
}

export function badInput(problems: Problem[] | string): KnitboneError {
  return new KnitboneError('bad-input', problems);
}
