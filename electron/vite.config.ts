import { builtinModules } from 'node:module';
import { defineConfig } from 'vite';

// The desktop shell's main process and preload, built for Electron: main as an ES module
// with every package left external (resolved from node_modules at run time, where
// electron-builder rebuilds better-sqlite3 for Electron); the preload as one CommonJS file,
// because sandboxed preloads cannot be ES modules.
const target = process.env.KNITBONE_ELECTRON_PART ?? 'main';
const external = ['electron', /^node:/, ...builtinModules, /^[a-z@][^:]*$/];

export default defineConfig({
  root: import.meta.dirname,
  build: {
    ssr: target === 'main' ? 'main.ts' : 'preload.ts',
    outDir: 'dist',
    emptyOutDir: false,
    target: 'node22',
    rollupOptions: {
      external: target === 'main' ? external : ['electron'],
      output: {
        format: target === 'main' ? 'es' : 'cjs',
        entryFileNames: target === 'main' ? 'main.js' : 'preload.cjs',
      },
    },
  },
});
