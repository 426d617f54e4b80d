import { apiErrorFrom, type ApiClient, type CallOptions, type ProgressEvent, type ShellSession } from './client';

/** What the desktop shell's preload exposes on window (see electron/preload.ts). */
export interface DesktopBridge {
  call(name: string, input: unknown, callId: string): Promise<{ ok: true; result: unknown } | { ok: false; error: unknown }>;
  cancel(callId: string): void;
  onProgress(listener: (callId: string, event: ProgressEvent) => void): () => void;
  session(): Promise<ShellSession>;
  pickFile(purpose: string): Promise<string | null>;
}

/** The API client over the desktop shell's bridge (IPC to the main process). */
export function bridgeClient(bridge: DesktopBridge): ApiClient {
  let next = 0;
  const listeners = new Map<string, (e: ProgressEvent) => void>();
  bridge.onProgress((callId, event) => listeners.get(callId)?.(event));

  async function call(name: string, input: unknown, options: CallOptions = {}): Promise<unknown> {
    const callId = `c${++next}`;
    if (options.onProgress) listeners.set(callId, options.onProgress);
    const onAbort = (): void => bridge.cancel(callId);
    options.signal?.addEventListener('abort', onAbort);
    try {
      const answer = await bridge.call(name, input ?? {}, callId);
      if (answer.ok) return answer.result;
      throw apiErrorFrom(answer);
    } finally {
      listeners.delete(callId);
      options.signal?.removeEventListener('abort', onAbort);
    }
  }

  return {
    call: call as ApiClient['call'],
    session: () => bridge.session(),
    pickFile: (purpose) => bridge.pickFile(purpose),
  };
}
