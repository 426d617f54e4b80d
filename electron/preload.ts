// The bridge between the sandboxed renderer and the main process. It exposes exactly the
// calls of renderer/src/api/bridge-client.ts and nothing of Node or Electron itself.
// Sandboxed preloads are CommonJS with only a few Electron modules; no imports of our own.
import { contextBridge, ipcRenderer, type IpcRendererEvent } from 'electron';

const isText = (v: unknown): v is string => typeof v === 'string' && v.length < 200;

contextBridge.exposeInMainWorld('knitboneBridge', {
  call(name: unknown, input: unknown, callId: unknown) {
    if (!isText(name) || !isText(callId)) return Promise.reject(new Error('a request needs a name and a call id'));
    return ipcRenderer.invoke('knitbone:call', { name, input, callId });
  },
  cancel(callId: unknown) {
    if (isText(callId)) ipcRenderer.send('knitbone:cancel', callId);
  },
  onProgress(listener: (callId: string, event: unknown) => void) {
    if (typeof listener !== 'function') return () => {};
    const handler = (_e: IpcRendererEvent, callId: string, event: unknown): void => listener(callId, event);
    ipcRenderer.on('knitbone:progress', handler);
    return () => void ipcRenderer.removeListener('knitbone:progress', handler);
  },
  session() {
    return ipcRenderer.invoke('knitbone:session');
  },
  pickFile(purpose: unknown) {
    if (!isText(purpose)) return Promise.resolve(null);
    return ipcRenderer.invoke('knitbone:pick-file', purpose);
  },
});
