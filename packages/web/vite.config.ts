import react from '@vitejs/plugin-react';
import { defineConfig } from 'vite';

// The API serves the built client at / in production and under `npm start`;
// `npm run dev` runs Vite's dev server with /api proxied to the API.
export default defineConfig({
  plugins: [react()],
  server: {
    host: '127.0.0.1',
    port: 5173,
    proxy: { '/api': { target: 'http://127.0.0.1:3000', changeOrigin: false } },
  },
  build: {
    outDir: 'dist',
    sourcemap: true,
    chunkSizeWarningLimit: 900,
    rolldownOptions: {
      output: {
        manualChunks(id: string) {
          if (id.includes('node_modules/@blueprintjs/table')) return 'blueprint-table';
          if (
            id.includes('node_modules/@blueprintjs/core') ||
            id.includes('node_modules/@floating-ui') ||
            id.includes('node_modules/react-popper') ||
            id.includes('node_modules/popper')
          )
            return 'blueprint';
          if (id.includes('node_modules/react') || id.includes('node_modules/scheduler'))
            return 'react';
          if (id.includes('node_modules/d3')) return 'd3';
          return undefined;
        },
      },
    },
  },
});
