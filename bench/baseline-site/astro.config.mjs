// The yardstick for the manual build: a bare Astro site of plain markdown pages, one per procedure.
import { defineConfig } from 'astro/config';

export default defineConfig({
  trailingSlash: 'always',
  build: { format: 'directory' },
  devToolbar: { enabled: false },
});
