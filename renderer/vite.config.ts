import react from '@vitejs/plugin-react';
import { defineConfig } from 'vite';

// The renderer: one React app, built to renderer/dist and served by either shell (the
// loopback server or Electron's app protocol). Relative base so both can serve it.
export default defineConfig({
  root: import.meta.dirname,
  base: './',
  plugins: [react()],
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    chunkSizeWarningLimit: 2000,
    sourcemap: false,
  },
});
