import { defineConfig, type Plugin } from 'vite';
import { contentSecurityPolicy } from './src/app/csp.js';

/** The built page carries its policy in a meta tag, so it holds however the files are served. */
function cspMeta(): Plugin {
  return {
    name: 'taperline-csp',
    apply: 'build',
    transformIndexHtml: () => [{ tag: 'meta', attrs: { 'http-equiv': 'Content-Security-Policy', content: contentSecurityPolicy('meta') }, injectTo: 'head-prepend' }],
  };
}

// The app is static: everything it needs (code, demo generator, coastlines, fonts) is bundled,
// so it runs offline and nothing is fetched at run time.
export default defineConfig({
  root: '.',
  base: './',
  plugins: [cspMeta()],
  server: { host: '127.0.0.1', port: 5173, strictPort: false, headers: { 'Content-Security-Policy': contentSecurityPolicy('dev-header') } },
  preview: { headers: { 'Content-Security-Policy': contentSecurityPolicy('header') } },
  worker: { format: 'es' },
  build: { outDir: 'dist', target: 'es2022', chunkSizeWarningLimit: 4000 },
  optimizeDeps: {
    include: ['maplibre-gl', '@deck.gl/core', '@deck.gl/layers', '@deck.gl/mapbox', 'proj4'],
  },
});
