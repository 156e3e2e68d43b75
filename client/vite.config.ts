import tailwindcss from '@tailwindcss/vite'
import react from '@vitejs/plugin-react'
import { defineConfig } from 'vite'

export default defineConfig({
  plugins: [react(), tailwindcss()],
  server: {
    host: '127.0.0.1',
    proxy: { '/api': process.env.KITWRIGHT_API ?? 'http://127.0.0.1:3001' },
  },
  build: { outDir: 'dist', emptyOutDir: true },
})
