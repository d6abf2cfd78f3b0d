// The operator manual site: static pages only, built from the procedures by `stepwright build`.
import { defineConfig } from 'astro/config';
import { watchProcedures } from './src/cli/watch-procedures.ts';

export default defineConfig({
  // `stepwright build` passes its own temporary outDir and swaps it into dist/ when the build is complete.
  outDir: './dist',
  trailingSlash: 'always',
  build: { format: 'directory', inlineStylesheets: 'never' },
  compressHTML: true,
  devToolbar: { enabled: false },
  // Procedure pages are generated from procedures/, never from markdown files in src/.
  markdown: {},
  // Live preview (`npm run dev`): a saved procedure file reloads the open pages, which re-check it.
  vite: { plugins: [watchProcedures()] },
});
