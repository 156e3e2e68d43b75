import { constants } from 'node:zlib'
import tailwindcss from '@tailwindcss/vite'
import react from '@vitejs/plugin-react'
import { defineConfig } from 'vite'
import { compression, defineAlgorithm } from 'vite-plugin-compression2'

export default defineConfig({
  plugins: [
    react(),
    tailwindcss(),
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
