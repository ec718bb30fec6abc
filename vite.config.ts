import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vite';

const apiPort = Number(process.env.PORT ?? 5180);

export default defineConfig({
  plugins: [react(), tailwindcss()],
  build: { outDir: process.env.BINWRIGHT_DIST_DIR ?? 'dist', emptyOutDir: true, chunkSizeWarningLimit: 1500 },
  server: {
    port: Number(process.env.BINWRIGHT_DEV_PORT ?? 5173),
    strictPort: true,
    proxy: { '/api': { target: `http://127.0.0.1:${apiPort}`, changeOrigin: false } },
  },
});
