import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';

// The client lives in web/; the built files go to dist/client, which Express serves.
// No dev proxy: `npm run dev` runs Vite in middleware mode inside the Express server.
const webRoot = fileURLToPath(new URL('./web', import.meta.url));
const outDir = fileURLToPath(new URL('./dist/client', import.meta.url));

export default defineConfig({
  root: webRoot,
  publicDir: 'public',
  plugins: [react(), tailwindcss()],
  build: {
    outDir,
    emptyOutDir: true,
    assetsDir: 'assets',
    sourcemap: false,
    // Every font is bundled as a file under /assets, never inlined (the CSP allows 'self').
    assetsInlineLimit: 0,
  },
  server: {
    host: '127.0.0.1',
    // In middleware mode (npm run dev) the hot-reload socket is a server of its own: keep it on
    // loopback like everything else, on a port that can be moved when two copies run.
    ws: { host: '127.0.0.1', port: Number(process.env.MW_HMR_PORT ?? 5181) },
  },
});
