#!/usr/bin/env node
// `npm start`: the desktop app where Electron's binary is installed, otherwise the same
// screens served on 127.0.0.1 for a browser, on the demo assemblage. See bin/start-app.ts.
import { register } from 'tsx/esm/api';

register();
await import('./start-app.ts');
