// An Astro integration for `stepwright build`: every page is handed to the build as soon as it is drawn, before
// Astro writes it, and Astro writes what the build hands back. Through Astro's prerenderer hook
// (`astro:build:start`, setPrerenderer): the default prerenderer draws the pages as before, and this one wraps it.
import type { AstroIntegration } from 'astro';

/** A page Astro will draw: its path in the site ("procedures/r-101/index.html") and the route that draws it. */
export interface PageToDraw {
  path: string;
  route: string;
}

export interface DrawnPageListener {
  /** Every page Astro is about to draw, before the first one is drawn. */
  planned(pages: PageToDraw[]): void;
  /** An HTML page as drawn; returns the bytes Astro writes instead. */
  drawn(page: PageToDraw, bytes: Buffer): Buffer;
}

/** The page's path in the site for a path Astro draws, with the `directory` build format and no base. */
export function pagePathFor(pathname: string, route: string): string {
  const trimmed = pathname.replace(/^\/+|\/+$/g, '');
  // Astro writes its error pages as files of their own (404.html), every other page as a folder's index.html.
  if (route === '/404' || route === '/500') return `${trimmed}.html`;
  return trimmed ? `${trimmed}/index.html` : 'index.html';
}

/**
 * Whether a page's path in the site is one the route draws: "/procedures/[slug]" draws
 * "procedures/<anything without a slash>/index.html"; a rest parameter ("[...path]") stands for any part.
 */
export function routeMatcher(route: string): (path: string) => boolean {
  const parts = route.replace(/^\/+|\/+$/g, '').split('/').filter(Boolean).map((part) =>
    /^\[\.\.\.[^\]]+\]$/.test(part) ? '.*' : part.split(/(\[[^\]]+\])/).map((piece) => (/^\[[^\]]+\]$/.test(piece) ? '[^/]+' : piece.replace(/[.*+?^${}()|[\]\\]/g, '\\$&'))).join(''));
  const pattern = new RegExp(`^${parts.join('/')}${parts.length ? '/' : ''}index\\.html$`);
  return (path) => pattern.test(path);
}

/** A path as given (a path that does not decode stays as it is: its page is then finished by the final pass). */
function decodedPath(encoded: string): string {
  try {
    return decodeURI(encoded);
  } catch {
    return encoded;
  }
}

export function drawnPages(listener: DrawnPageListener, base: string): AstroIntegration {
  const prefix = base.replace(/\/+$/, '');
  return {
    name: 'stepwright-drawn-pages',
    hooks: {
      'astro:build:start': ({ setPrerenderer }) => {
        // An Astro without the hook draws and writes the pages as they are: the build's final pass finishes them.
        if (typeof setPrerenderer !== 'function') return;
        setPrerenderer((astro) => ({
          ...astro,
          name: 'stepwright-drawn-pages',
          setup: astro.setup?.bind(astro),
          teardown: astro.teardown?.bind(astro),
          async getStaticPaths() {
            const paths = await astro.getStaticPaths();
            listener.planned(paths.map(({ pathname, route }) => ({ path: pagePathFor(pathname, route.route), route: route.route })));
            return paths;
          },
          async render(request, options) {
            const result = await astro.render(request, options);
            const { response, metadata } = result instanceof Response ? { response: result, metadata: undefined } : result;
            if (response.status !== 200 || !response.body || !(response.headers.get('content-type') ?? '').includes('text/html')) return result;
            // The request's path is percent-encoded; Astro names the file with the path as given.
            let pathname = decodedPath(new URL(request.url).pathname);
            if (prefix && pathname.startsWith(prefix)) pathname = pathname.slice(prefix.length);
            const page = { path: pagePathFor(pathname, options.routeData.route), route: options.routeData.route };
            const bytes = listener.drawn(page, Buffer.from(await response.arrayBuffer()));
            const drawn = new Response(bytes as Uint8Array<ArrayBuffer>, { status: response.status, statusText: response.statusText, headers: response.headers });
            return metadata === undefined ? drawn : { response: drawn, metadata };
          },
        }));
      },
    },
  };
}
