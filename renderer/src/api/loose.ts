import type { ApiClient, CallOptions } from './client';

/**
 * A call by a name this build's types may not know yet (areas of the host API land at
 * different times; screens check `has(name)` first). The host still validates the input.
 */
export function callByName<T = unknown>(client: ApiClient, name: string, input: unknown, options?: CallOptions): Promise<T> {
  return (client.call as (n: string, i: unknown, o?: CallOptions) => Promise<T>)(name, input, options);
}
