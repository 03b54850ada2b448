import { defineConfig } from 'vite';

// The app is static: everything it needs (code, demo generator, coastlines, fonts) is bundled,
// so it runs offline and nothing is fetched at run time.
export default defineConfig({
  root: '.',
  base: './',
  server: { host: '127.0.0.1', port: 5173, strictPort: false },
  worker: { format: 'es' },
  build: { outDir: 'dist', target: 'es2022', chunkSizeWarningLimit: 4000 },
  optimizeDeps: {
    include: ['maplibre-gl', '@deck.gl/core', '@deck.gl/layers', '@deck.gl/mapbox', 'geotiff', 'proj4'],
  },
});
