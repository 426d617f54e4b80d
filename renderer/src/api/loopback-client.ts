import { ApiError, apiErrorFrom, type ApiClient, type CallOptions, type ShellSession } from './client';

/**
 * The API client over the loopback server: the run's token comes from a meta tag of the
 * served page and goes with every request as a header. Calls that want progress ask for
 * server-sent events and read them from the response stream.
 */
export function loopbackClient(token: string): ApiClient {
  const headers = { 'X-Knitbone-Token': token };

  async function post(name: string, input: unknown, options: CallOptions = {}): Promise<unknown> {
    const wantsStream = options.onProgress !== undefined;
    let res: Response;
    try {
      res = await fetch(`/api/call/${encodeURIComponent(name)}`, {
        method: 'POST',
        headers: { ...headers, 'Content-Type': 'application/json', Accept: wantsStream ? 'text/event-stream' : 'application/json' },
        body: JSON.stringify(input ?? {}),
        signal: options.signal,
      });
    } catch (err) {
      if ((err as Error).name === 'AbortError') throw err;
      throw new ApiError('internal', [{ message: 'the knitbone server does not answer; is it still running?' }]);
    }
    if (!wantsStream || !(res.headers.get('content-type') ?? '').startsWith('text/event-stream')) {
      const body = (await res.json().catch(() => null)) as { ok?: boolean; result?: unknown } | null;
      if (body?.ok === true) return body.result;
      throw apiErrorFrom(body);
    }
    return readEvents(res, options);
  }

  return {
    call: post as ApiClient['call'],
    async session(): Promise<ShellSession> {
      const res = await fetch('/api/session', { headers });
      const body = (await res.json()) as { ok: boolean; result: ShellSession };
      if (!body.ok) throw apiErrorFrom(body);
      return body.result;
    },
  };
}

async function readEvents(res: Response, options: CallOptions): Promise<unknown> {
  const reader = res.body!.pipeThrough(new TextDecoderStream()).getReader();
  let buffer = '';
  for (;;) {
    const { value, done } = await reader.read();
    if (done) break;
    buffer += value;
    let cut: number;
    while ((cut = buffer.indexOf('\n\n')) >= 0) {
      const block = buffer.slice(0, cut);
      buffer = buffer.slice(cut + 2);
      let event = 'message';
      let data = '';
      for (const line of block.split('\n')) {
        if (line.startsWith('event: ')) event = line.slice(7);
        else if (line.startsWith('data: ')) data += line.slice(6);
      }
      const parsed = JSON.parse(data) as { ok?: boolean; result?: unknown };
      if (event === 'progress') options.onProgress?.(parsed as never);
      else if (event === 'result') return parsed.result;
      else if (event === 'error') throw apiErrorFrom(parsed);
    }
  }
  throw new ApiError('internal', [{ message: 'the knitbone server closed the answer before it finished' }]);
}
