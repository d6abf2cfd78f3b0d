// Every built page has its tags, ids and dates kept whole as it is rendered, before Astro writes it: the build
// then writes each page once instead of reading and rewriting every page afterwards.
import type { MiddlewareHandler } from 'astro';
import { keepTokensWhole } from '../render/keep-tokens-whole.ts';

export const onRequest: MiddlewareHandler = async (_context, next) => {
  const response = await next();
  // The live preview shows pages as they render; only the published manual is post-processed.
  const dev = (import.meta as { env?: { DEV?: boolean } }).env?.DEV === true;
  if (dev || !(response.headers.get('content-type') ?? '').includes('text/html')) return response;
  const html = keepTokensWhole(await response.text());
  return new Response(html, { status: response.status, statusText: response.statusText, headers: new Headers(response.headers) });
};
