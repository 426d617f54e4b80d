import type { ServerResponse } from 'node:http';
import { KnitboneError, type ErrorKind, type Problem } from '../errors';
import { SECURITY_HEADERS } from './csp';

/** HTTP status for each kind of host error (core/host/errors.ts). */
export const STATUS_OF_KIND: Record<ErrorKind, number> = {
  'bad-input': 400,
  usage: 400,
  'not-found': 404,
  conflict: 409,
  refused: 403,
  internal: 500,
};

/** The JSON body of every error answer: the kind and a list of problems. */
export interface ErrorBody {
  ok: false;
  error: { kind: ErrorKind; problems: Problem[] };
}

export function errorBody(err: unknown): ErrorBody {
  if (err instanceof KnitboneError) return { ok: false, error: { kind: err.kind, problems: err.problems } };
  const message = err instanceof Error ? err.message : String(err);
  return { ok: false, error: { kind: 'internal', problems: [{ message: `internal error: ${message}` }] } };
}

export function sendJson(res: ServerResponse, status: number, body: unknown): void {
  const text = JSON.stringify(body);
  res.writeHead(status, {
    ...SECURITY_HEADERS,
    'Content-Type': 'application/json; charset=utf-8',
    'Content-Length': String(Buffer.byteLength(text)),
  });
  res.end(text);
}

export function sendError(res: ServerResponse, err: unknown): void {
  const body = errorBody(err);
  sendJson(res, STATUS_OF_KIND[body.error.kind], body);
}

/** A refusal with one problem, for the transport's own checks (token, method, size). */
export function sendRefusal(res: ServerResponse, status: number, kind: ErrorKind, message: string): void {
  sendJson(res, status, { ok: false, error: { kind, problems: [{ message }] } } satisfies ErrorBody);
}
