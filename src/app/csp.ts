/**
 * The Content-Security-Policy of the app, one definition for the built page (a meta tag) and the
 * dev and preview servers (a header). It forbids every remote connection and inline or injected
 * script; what it allows, and why:
 *  - script 'self' + 'wasm-unsafe-eval': our bundle, and compiling the WebAssembly of the
 *    GeoPackage writer (sql.js) and the ZSTD decoder; never eval of text;
 *  - worker 'self' blob:: our engine worker, and MapLibre's, which it starts from a blob;
 *  - connect 'self' data: blob:: the bundled wasm, demo and fonts (the ZSTD decoder reads its
 *    module from a data: URL); nothing off the machine;
 *  - img 'self' data: blob:: rendered raster tiles and exported images;
 *  - style 'unsafe-inline': style attributes set by the map library on its own elements.
 * Kept free of app imports so vite.config.ts can read it.
 */
export function contentSecurityPolicy(where: 'meta' | 'header' | 'dev-header'): string {
  const dev = where === 'dev-header';
  return [
    "default-src 'self'",
    "script-src 'self' 'wasm-unsafe-eval'",
    "worker-src 'self' blob:",
    `connect-src 'self' data: blob:${dev ? ' ws://127.0.0.1:* ws://localhost:*' : ''}`,
    "img-src 'self' data: blob:",
    "style-src 'self' 'unsafe-inline'",
    "font-src 'self' data:",
    "object-src 'none'",
    "base-uri 'none'",
    "form-action 'none'",
    // not allowed in a meta tag (browsers ignore it there and say so)
    ...(where === 'meta' ? [] : ["frame-ancestors 'none'"]),
  ].join('; ');
}
