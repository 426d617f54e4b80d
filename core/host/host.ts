import { z } from 'zod';
import { KnitboneError, type Problem } from './errors';
import type { ProgressEvent } from './request';
import { requests, type RequestName, type Requests } from './requests/index';

export type RequestInput<N extends RequestName> = z.input<Requests[N]['input']>;
export type RequestOutput<N extends RequestName> = Awaited<ReturnType<Requests[N]['run']>>;

export interface CallOptions {
  onProgress?: (event: ProgressEvent) => void;
  signal?: AbortSignal;
}

/** Turn zod's issues into problems that name the field. */
export function problemsFromZod(error: z.ZodError): Problem[] {
  return error.issues.map((issue) => ({
    field: issue.path.length ? issue.path.join('.') : undefined,
    message: issue.message,
  }));
}

/**
 * The application API: the one way in for every shell. Input is validated against the
 * request's schema before the handler runs; unknown names are refused.
 */
export class Host {
  static requestNames(): RequestName[] {
    return Object.keys(requests) as RequestName[];
  }

  static has(name: string): name is RequestName {
    return Object.prototype.hasOwnProperty.call(requests, name);
  }

  async call<N extends RequestName>(name: N, input: RequestInput<N>, options: CallOptions = {}): Promise<RequestOutput<N>> {
    return this.callUnchecked(name, input, options) as Promise<RequestOutput<N>>;
  }

  /** For shells that receive a name and a body from outside (IPC, HTTP): both are checked here. */
  async callUnchecked(name: string, input: unknown, options: CallOptions = {}): Promise<unknown> {
    if (!Host.has(name)) {
      throw new KnitboneError('usage', `unknown request "${name}"; known requests: ${Host.requestNames().join(', ')}`);
    }
    const def = requests[name] as unknown as {
      input: z.ZodType;
      run: (input: unknown, ctx: { onProgress: (e: ProgressEvent) => void; signal: AbortSignal }) => unknown;
    };
    const parsed = def.input.safeParse(input ?? {});
    if (!parsed.success) throw new KnitboneError('bad-input', problemsFromZod(parsed.error));
    return await def.run(parsed.data, {
      onProgress: options.onProgress ?? (() => {}),
      signal: options.signal ?? new AbortController().signal,
    });
  }
}
