import { constants } from 'node:zlib'
import tailwindcss from '@tailwindcss/vite'
import react from '@vitejs/plugin-react'
import { defineConfig } from 'vite'
import { compression, defineAlgorithm } from 'vite-plugin-compression2'
import { VitePWA } from 'vite-plugin-pwa'

export default defineConfig({
  plugins: [
    react(),
    tailwindcss(),
    // An installable app whose shell and bench screens open without the network once visited (a
    // shop's Wi-Fi is weakest at the saw and the sink): every built script, style and font is
    // precached by a Workbox service worker, any page address falls back to the cached app page, and
    // the API reads a bench needs to show its last list are answered from the network, else (no
    // network, or none within 4 s) from the last answer kept. Bench actions taken meanwhile wait in
    // the tablet's queue (src/lib/offline/). Not in `vite dev`: there the network is the dev server.
    VitePWA({
      registerType: 'autoUpdate',
      injectRegister: 'script-defer',
      manifest: {
        name: 'Kitwright',
        short_name: 'Kitwright',
        description: 'Kitwright: orders, cut runs and the cut, build and pack benches of a small-batch kit shop',
        start_url: '/',
        scope: '/',
        display: 'standalone',
        background_color: '#f5f5f4',
        theme_color: '#0d3523',
        icons: [
          { src: '/icon-192.png', sizes: '192x192', type: 'image/png' },
          { src: '/icon-512.png', sizes: '512x512', type: 'image/png' },
          { src: '/icon.svg', sizes: 'any', type: 'image/svg+xml', purpose: 'any' },
        ],
      },
      workbox: {
        // The fonts are woff2 (every browser the benches use reads it); the .woff fallbacks stay on the server.
        globPatterns: ['**/*.{js,css,html,woff2,svg,png,webmanifest}'],
        navigateFallback: '/index.html',
        navigateFallbackDenylist: [/^\/api\//],
        cleanupOutdatedCaches: true,
        clientsClaim: true,
        skipWaiting: true,
        runtimeCaching: [
          {
            // The reads behind the bench screens (this function is copied into the service worker as
            // text, so it names nothing from outside itself).
            urlPattern: ({ url, request, sameOrigin }) =>
              sameOrigin &&
              request.method === 'GET' &&
              /^\/api\/(auth\/me|settings|cut-runs(\/worklist|\/[0-9a-f-]{36})?|build\/(worklist|lookup)|pack\/(worklist|lookup|orders\/[0-9a-f-]{36})|shipments\/[0-9a-f-]{36}\/customs)$/.test(
                url.pathname,
              ),
            handler: 'NetworkFirst',
            options: {
              cacheName: 'kitwright-bench-reads',
              networkTimeoutSeconds: 4,
              expiration: { maxEntries: 200, maxAgeSeconds: 7 * 24 * 60 * 60 },
              cacheableResponse: { statuses: [200] },
            },
          },
        ],
      },
    }),
    // Brotli at its best (quality 11, about 9 % smaller than the server's on-the-fly quality 5 and far
    // too slow to do per request) and gzip, written once beside each script and style; the server
    // sends whichever the browser accepts (server/src/lib/client-files.ts).
    compression({
      include: /\.(js|css)$/,
      threshold: 1024,
      skipIfLargerOrEqual: true,
      logLevel: 'silent',
      scheduler: { limit: 2 },
      algorithms: [defineAlgorithm('brotliCompress', { params: { [constants.BROTLI_PARAM_QUALITY]: 11 } }), defineAlgorithm('gzip', { level: 9 })],
    }),
  ],
  server: {
    host: '127.0.0.1',
    proxy: { '/api': process.env.KITWRIGHT_API ?? 'http://127.0.0.1:3001' },
  },
  build: { outDir: 'dist', emptyOutDir: true },
})
