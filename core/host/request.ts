import type { z } from 'zod';

/** Progress of long work, sent to whoever called: a terminal bar, an IPC event, an SSE stream. */
export interface ProgressEvent {
  /** What is being done, in a few words ("reading scans"). */
  stage: string;
  done: number;
  total: number;
  /** Optional detail, e.g. the file being read. */
  detail?: string;
}

/** What a request handler may use besides its validated input. */
export interface RequestContext {
  onProgress: (event: ProgressEvent) => void;
  signal: AbortSignal;
}

/**
 * One operation of the host API: a name, a zod schema for its input (validated at the
 * edge before the handler runs), and the handler itself.
 */
export interface RequestDef<S extends z.ZodType, O> {
  /** One line for help texts and the HTTP index. */
  summary: string;
  input: S;
  run: (input: z.output<S>, ctx: RequestContext) => O | Promise<O>;
}

export function defineRequest<S extends z.ZodType, O>(def: RequestDef<S, O>): RequestDef<S, O> {
  return def;
}
