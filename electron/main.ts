// The desktop shell: one window on the built renderer, native menus and file dialogs, and
// the host API over IPC. Hardened: the renderer is sandboxed with context isolation and no
// Node; it may load only the app's own files (knitbone://app/), never navigate away or open
// windows; every IPC message is validated, and only the app's own page may send one.
import { app, BrowserWindow, dialog, ipcMain, Menu, net, protocol, session, shell, type IpcMainInvokeEvent, type MenuItemConstructorOptions } from 'electron';
import { existsSync } from 'node:fs';
import { extname, join, normalize, resolve, sep } from 'node:path';
import { pathToFileURL } from 'node:url';
import { ensureDemoCatalogue } from '../core/host/demo-catalogue';
import { Host } from '../core/host/host';
import { errorBody } from '../core/host/http/answer';
import { RENDERER_CSP } from '../core/host/http/csp';
import type { ShellSession } from '../core/host/session';
import { requests } from '../core/host/requests/index';
import { APP_ORIGIN, APP_SCHEME, CallMessage, CancelMessage, CHANNELS, PickPurpose } from './ipc-contract';
import { RecentCatalogues } from './recent';

protocol.registerSchemesAsPrivileged([
  { scheme: APP_SCHEME, privileges: { standard: true, secure: true, supportFetchAPI: true } },
]);

const appRoot = app.getAppPath();
const rendererDir = join(appRoot, 'renderer', 'dist');
const preloadFile = join(appRoot, 'electron', 'dist', 'preload.cjs');
const host = new Host();
const recent = new RecentCatalogues(join(app.getPath('userData'), 'recent-catalogues.json'));
const running = new Map<string, AbortController>();
let currentCatalogue: string | null = null;
let demoCatalogue: string | null = null;
let win: BrowserWindow | null = null;

if (!app.requestSingleInstanceLock()) {
  app.quit();
} else {
  app.on('second-instance', () => {
    if (win) {
      if (win.isMinimized()) win.restore();
      win.focus();
    }
  });
  app.whenReady().then(start, (err) => {
    dialog.showErrorBox('knitbone could not start', String(err));
    app.quit();
  });
  app.on('window-all-closed', () => app.quit());
}

async function start(): Promise<void> {
  serveAppFiles();
  lockDownSessions();
  answerIpc();
  const demoTarget = join(app.getPath('userData'), 'demo', 'demo.sqlite');
  demoCatalogue = await ensureDemoCatalogue(join(appRoot, 'demo-data', 'sample'), demoTarget, () => {}).catch(() => null);
  const fromArgs = process.argv.slice(app.isPackaged ? 1 : 2).find((a) => a.endsWith('.sqlite'));
  if (fromArgs && existsSync(fromArgs)) openCatalogue(resolve(fromArgs));
  buildMenu();
  createWindow();
}

/** knitbone://app/<file> -> renderer/dist/<file>, with the CSP on every answer. */
function serveAppFiles(): void {
  protocol.handle(APP_SCHEME, async (request) => {
    const url = new URL(request.url);
    if (url.host !== 'app') return new Response('not found', { status: 404 });
    const rel = normalize(decodeURIComponent(url.pathname === '/' ? '/index.html' : url.pathname));
    const file = resolve(rendererDir, '.' + rel);
    if (!file.startsWith(resolve(rendererDir) + sep) || !existsSync(file)) return new Response('not found', { status: 404 });
    const answer = await net.fetch(pathToFileURL(file).toString());
    const headers = new Headers(answer.headers);
    headers.set('Content-Security-Policy', RENDERER_CSP);
    headers.set('X-Content-Type-Options', 'nosniff');
    if (extname(file) === '.js') headers.set('Content-Type', 'text/javascript');
    return new Response(answer.body, { status: answer.status, headers });
  });
}

/** No remote content, no permissions, no navigation, no new windows, no webviews. */
function lockDownSessions(): void {
  session.defaultSession.setPermissionRequestHandler((_wc, _permission, callback) => callback(false));
  session.defaultSession.setPermissionCheckHandler(() => false);
  session.defaultSession.webRequest.onBeforeRequest((details, callback) => {
    const ok = details.url.startsWith(`${APP_ORIGIN}/`) || details.url.startsWith('devtools:');
    callback({ cancel: !ok });
  });
  app.on('web-contents-created', (_e, contents) => {
    contents.on('will-navigate', (event, url) => {
      if (!url.startsWith(`${APP_ORIGIN}/`)) event.preventDefault();
    });
    contents.on('will-redirect', (event) => event.preventDefault());
    contents.on('will-attach-webview', (event) => event.preventDefault());
    contents.setWindowOpenHandler(({ url }) => {
      // Links to documentation open in the user's browser, never inside the app.
      if (url.startsWith('https://')) void shell.openExternal(url);
      return { action: 'deny' };
    });
  });
}

function createWindow(): void {
  win = new BrowserWindow({
    width: 1400,
    height: 900,
    minWidth: 900,
    minHeight: 600,
    title: 'knitbone',
    show: false,
    webPreferences: {
      preload: preloadFile,
      contextIsolation: true,
      nodeIntegration: false,
      nodeIntegrationInWorker: false,
      sandbox: true,
      webSecurity: true,
      allowRunningInsecureContent: false,
      webviewTag: false,
      navigateOnDragDrop: false,
      spellcheck: false,
    },
  });
  win.once('ready-to-show', () => win?.show());
  void win.loadURL(`${APP_ORIGIN}/index.html`);
  win.on('closed', () => (win = null));
}

/** Only the app's own top-level page may call the main process. */
function fromApp(event: IpcMainInvokeEvent | Electron.IpcMainEvent): boolean {
  const frame = event.senderFrame;
  return !!frame && frame === event.sender.mainFrame && frame.url.startsWith(`${APP_ORIGIN}/`);
}

const refused = (message: string) => ({ ok: false as const, error: { kind: 'refused', problems: [{ message }] } });

function answerIpc(): void {
  ipcMain.handle(CHANNELS.call, async (event, message: unknown) => {
    if (!fromApp(event)) return refused('requests are answered only for the app window');
    const parsed = CallMessage.safeParse(message);
    if (!parsed.success) {
      return { ok: false, error: { kind: 'bad-input', problems: parsed.error.issues.map((i) => ({ message: `${i.path.join('.') || 'message'}: ${i.message}` })) } };
    }
    const { name, input, callId } = parsed.data;
    const abort = new AbortController();
    running.set(callId, abort);
    try {
      const result = await host.callUnchecked(name, input, {
        signal: abort.signal,
        onProgress: (e) => event.sender.send(CHANNELS.progress, callId, e),
      });
      return { ok: true, result: result ?? null };
    } catch (err) {
      return errorBody(err);
    } finally {
      running.delete(callId);
    }
  });
  ipcMain.on(CHANNELS.cancel, (event, callId: unknown) => {
    if (!fromApp(event)) return;
    const parsed = CancelMessage.safeParse(callId);
    if (parsed.success) running.get(parsed.data)?.abort();
  });
  ipcMain.handle(CHANNELS.session, (event): ShellSession | null => {
    if (!fromApp(event)) return null;
    return {
      catalogue: currentCatalogue,
      demoCatalogue,
      recent: recent.list(),
      canPickFiles: true,
      requests: Host.requestNames().map((name) => ({ name, summary: (requests[name] as { summary: string }).summary })),
    };
  });
  ipcMain.handle(CHANNELS.pickFile, async (event, purpose: unknown) => {
    if (!fromApp(event) || !win) return null;
    const parsed = PickPurpose.safeParse(purpose);
    if (!parsed.success) return null;
    return pickFile(parsed.data);
  });
}

async function pickFile(purpose: PickPurpose): Promise<string | null> {
  if (!win) return null;
  const sqlite = [{ name: 'knitbone catalogue', extensions: ['sqlite'] }];
  if (purpose === 'new-catalogue') {
    const r = await dialog.showSaveDialog(win, { title: 'New catalogue', filters: sqlite });
    return r.canceled || !r.filePath ? null : r.filePath;
  }
  const r = await dialog.showOpenDialog(win, {
    title: purpose === 'open-catalogue' ? 'Open a catalogue' : purpose === 'import-csv' ? 'Import specimens (CSV)' : 'Import a folder of scans',
    properties: purpose === 'import-scans' ? ['openDirectory'] : ['openFile'],
    filters: purpose === 'open-catalogue' ? sqlite : purpose === 'import-csv' ? [{ name: 'CSV', extensions: ['csv', 'txt'] }] : undefined,
  });
  const chosen = r.canceled ? null : (r.filePaths[0] ?? null);
  if (chosen && purpose === 'open-catalogue') recent.add(chosen);
  return chosen;
}

function openCatalogue(path: string): void {
  currentCatalogue = path;
  recent.add(path);
  win?.webContents.reload();
  buildMenu();
}

function buildMenu(): void {
  const recentItems: MenuItemConstructorOptions[] = recent.list().map((p) => ({ label: p, click: () => openCatalogue(p) }));
  const template: MenuItemConstructorOptions[] = [
    {
      label: 'Assemblage',
      submenu: [
        {
          label: 'Open catalogue...',
          accelerator: 'CmdOrCtrl+O',
          click: async () => {
            const p = await pickFile('open-catalogue');
            if (p) openCatalogue(p);
          },
        },
        { label: 'Open demo assemblage', enabled: demoCatalogue !== null, click: () => demoCatalogue && openCatalogue(demoCatalogue) },
        { label: 'Recent', submenu: recentItems.length ? recentItems : [{ label: 'none yet', enabled: false }] },
        { type: 'separator' },
        { role: 'quit' },
      ],
    },
    { label: 'Edit', submenu: [{ role: 'undo' }, { role: 'redo' }, { type: 'separator' }, { role: 'cut' }, { role: 'copy' }, { role: 'paste' }, { role: 'selectAll' }] },
    { label: 'View', submenu: [{ role: 'reload' }, { role: 'resetZoom' }, { role: 'zoomIn' }, { role: 'zoomOut' }, { type: 'separator' }, { role: 'togglefullscreen' }] },
  ];
  Menu.setApplicationMenu(Menu.buildFromTemplate(template));
}
