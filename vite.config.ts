import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { VitePWA } from 'vite-plugin-pwa';
import { fileURLToPath } from 'node:url';

const apiPort = process.env.API_PORT ?? '3100';

export default defineConfig({
  resolve: { alias: { '@shared': fileURLToPath(new URL('./shared', import.meta.url)) } },
  plugins: [
    react(),
    tailwindcss(),
    VitePWA({
      registerType: 'autoUpdate',
      // The Bench registers the worker itself once someone is signed in (src/features/bench/area.tsx):
      // registered on the sign-in page, its precache requests raced the sign-in and the session
      // cookie refreshed on their answers could replace the new one.
      injectRegister: null,
      includeAssets: ['icon.svg'],
      manifest: {
        name: 'Sparkwright',
        short_name: 'Sparkwright',
        description: 'Guided ignition diagnosis for small-engine and powersports shops',
        theme_color: '#1d232c',
        background_color: '#f5f2ea',
        display: 'standalone',
        start_url: '/bench',
        icons: [{ src: '/icon.svg', sizes: 'any', type: 'image/svg+xml', purpose: 'any' }],
      },
      workbox: {
        // the app shell works without signal; the API is never cached by the service worker
        navigateFallback: '/index.html',
        navigateFallbackDenylist: [/^\/api\//],
        globPatterns: ['**/*.{js,css,html,svg,woff2}'],
        // the editor and its layout engine are for authors at a desk; keep them off technicians' phones
        globIgnores: ['**/elk.bundled-*.js', '**/editor-page-*.js'],
        maximumFileSizeToCacheInBytes: 4 * 1024 * 1024,
        // Bench: an open diagnosis must survive a reload without signal. The diagnosis itself is in
        // IndexedDB; only "who am I" is needed to get past the sign-in guard, so that one answer is
        // kept (network first, the cached copy only when the network fails).
        runtimeCaching: [
          {
            urlPattern: ({ url, request }) => request.method === 'GET' && url.pathname === '/api/auth/session',
            handler: 'NetworkFirst',
            options: { cacheName: 'sw-session', networkTimeoutSeconds: 4, expiration: { maxEntries: 1 } },
          },
        ],
      },
    }),
  ],
  build: {
    manifest: true,
    rolldownOptions: {
      output: {
        // Libraries get chunks of their own, named for what they are, so the bundler never folds
        // a form or table library into a chunk that the entry (and so every phone) downloads.
        codeSplitting: {
          groups: [
            { name: 'lib-react', test: /node_modules[\\/](react|react-dom|scheduler)[\\/]/, priority: 30 },
            { name: 'lib-zod', test: /node_modules[\\/]zod[\\/]/, priority: 20 },
            { name: 'lib-forms', test: /node_modules[\\/](react-hook-form|@hookform)[\\/]/, priority: 20 },
            { name: 'lib-table', test: /node_modules[\\/]@tanstack[\\/](react-table|table-core)[\\/]/, priority: 20 },
          ],
        },
      },
    },
    sourcemap: false,
    chunkSizeWarningLimit: 900,
  },
  server: {
    proxy: { '/api': { target: `http://127.0.0.1:${apiPort}`, changeOrigin: false } },
  },
});
