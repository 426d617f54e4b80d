import type { Problem, ErrorKind } from '../../../core/host/errors';
import type { RequestInput, RequestOutput } from '../../../core/host/host';
import type { RequestName } from '../../../core/host/requests/index';
import type { ProgressEvent } from '../../../core/host/request';
import type { ShellSession } from '../../../core/host/session';

export type { ProgressEvent, ShellSession, RequestName, RequestInput, RequestOutput, Problem };

export interface CallOptions {
  onProgress?: (event: ProgressEvent) => void;
  signal?: AbortSignal;
}

/**
 * What the screens talk to: the host API's requests by name, typed from the host's
 * request table, and what the shell says about itself. Both shells (loopback HTTP,
 * Electron IPC) provide one; the screens never know which.
 */
export interface ApiClient {
  call<N extends RequestName>(name: N, input: RequestInput<N>, options?: CallOptions): Promise<RequestOutput<N>>;
  session(): Promise<ShellSession>;
  /** Ask the user for a file with a native dialog; only when session().canPickFiles. */
  pickFile?(purpose: 'open-catalogue' | 'new-catalogue' | 'import-csv' | 'import-scans'): Promise<string | null>;
}

/** An error answered by the host: its kind and the problems it lists. */
export class ApiError extends Error {
  constructor(
    readonly kind: ErrorKind,
    readonly problems: Problem[],
  ) {
    super(problems.map((p) => p.message).join('\n') || kind);
    this.name = 'ApiError';
  }
}

/** Turn an `{ok: false, error}` answer (from either shell) into an ApiError. */
export function apiErrorFrom(body: unknown): ApiError {
  const e = (body as { error?: { kind?: ErrorKind; problems?: Problem[] } } | null)?.error;
  if (e && Array.isArray(e.problems)) return new ApiError(e.kind ?? 'internal', e.problems);
  return new ApiError('internal', [{ message: 'the app got an answer it does not understand' }]);
}
