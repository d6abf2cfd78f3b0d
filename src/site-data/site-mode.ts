// How `stepwright build` and `stepwright dev` tell the pages what they are built for, in the process's environment.
// The pages' server code in a build runs the site-data modules as they are (not a copy Vite made of them), so it
// reads these rather than Vite's import.meta.env.

/** The base Astro builds the pages with ("/" or e.g. "/manual/"), the one src/site/lib/url.ts reads from Astro. */
export const siteBaseVariable = 'STEPWRIGHT_SITE_BASE';

/** "1" in the live preview, which re-reads the procedures on every save and shows check errors on the pages. */
export const livePreviewVariable = 'STEPWRIGHT_LIVE_PREVIEW';
