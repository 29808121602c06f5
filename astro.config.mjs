// Astro configuration for the Strobe Atlas catalogue site.
// The site only presents results records written by the catalogue layer (src/catalogue).
// Scripts and styles are always emitted as files, never inlined into pages, so the
// pages run under a Content-Security-Policy of script-src 'self' (no inline script).
import { defineConfig } from 'astro/config';

export default defineConfig({
  site: 'http://127.0.0.1',
  output: 'static',
  trailingSlash: 'ignore',
  // Scripts ship as files, never inline: the Content-Security-Policy of the preview
  // server (src/cli/static-server.ts) allows scripts from the site's own files only.
  build: { inlineStylesheets: 'never' },
  vite: { build: { assetsInlineLimit: 0 } },
});
