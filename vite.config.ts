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
    rolldownOptions: {
      output: {
        // Libraries in chunks of their own, named for what they are, so a screen fetches only the
        // ones it uses and a change to our code does not re-download them. Each group is a
        // library with a clear job; the screens themselves are split by the router's lazy imports.
        codeSplitting: {
          groups: [
            {
              name: 'react',
              test: /node_modules[\\/](react|react-dom|scheduler)[\\/]/,
              priority: 30,
            },
            {
              name: 'router',
              test: /node_modules[\\/](react-router|react-router-dom|cookie|set-cookie-parser)[\\/]/,
              priority: 30,
            },
            {
              name: 'query',
              test: /node_modules[\\/]@tanstack[\\/](react-query|query-core)[\\/]/,
              priority: 30,
            },
            {
              name: 'table',
              test: /node_modules[\\/]@tanstack[\\/](react-table|table-core)[\\/]/,
              priority: 30,
            },
            {
              name: 'codemirror',
              test: /node_modules[\\/](@codemirror|@lezer|@uiw|@marijn|crelt|style-mod|w3c-keyname)[\\/]/,
              priority: 20,
            },
            // Its script only: the stylesheet and fonts are imported by main.tsx and stay with the entry.
            { name: 'katex', test: /node_modules[\\/]katex[\\/].*\.m?js$/, priority: 20 },
            { name: 'marked', test: /node_modules[\\/]marked[\\/]/, priority: 20 },
            // recharts and what it is built on (d3 scales and shapes, its redux store)
            {
              name: 'charts',
              test: /node_modules[\\/](recharts|d3-[a-z-]+|victory-vendor|internmap|@reduxjs|redux|redux-thunk|react-redux|reselect|immer|es-toolkit|eventemitter3|decimal\.js-light|tiny-invariant|clsx|use-sync-external-store)[\\/]/,
              priority: 10,
            },
          ],
        },
      },
    },
  },
  server: {
    host: '127.0.0.1',
    // In middleware mode (npm run dev) the hot-reload socket is a server of its own: keep it on
    // loopback like everything else, on a port that can be moved when two copies run.
    ws: { host: '127.0.0.1', port: Number(process.env.MW_HMR_PORT ?? 5181) },
  },
});
