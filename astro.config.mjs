// The operator manual site: static pages only, built from the procedures by `stepwright build`.
import { defineConfig } from 'astro/config';

export default defineConfig({
  // `stepwright build` passes its own temporary outDir and swaps it into dist/ when the build is complete.
  outDir: './dist',
  trailingSlash: 'always',
  build: { format: 'directory', inlineStylesheets: 'never' },
  compressHTML: true,
  devToolbar: { enabled: false },
  // Procedure pages are generated from procedures/, never from markdown files in src/.
  markdown: {},
});
