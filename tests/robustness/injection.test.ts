// Hostile text in every field and in the body: the built manual, loaded in real Chromium, runs none of it and
// fetches nothing from outside; absurd YAML is refused quickly with a clear diagnostic.
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import type { Server } from 'node:http';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';
import type { Browser } from 'playwright-core';
import { chromiumPath, launchBrowser } from '../e2e/chromium.ts';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';
import { readSource } from '../../src/parse/read-source.ts';
import { startStaticServer } from '../../src/cli/serve-command.ts';
import { attacker, injectionProcedures, payloads } from './injection-payloads.ts';
import { build } from './run-build.ts';
import { runCli } from '../cli/run-cli.ts';

const haveChromium = existsSync(chromiumPath);
if (!haveChromium) console.warn(`Skipping the injection browser test: ${chromiumPath} is missing. Install it with: apt-get install -y chromium`);

const files = injectionProcedures();

describe('hostile procedure text', () => {
  it(`has at least 50 payloads of every kind, in every text field and the body`, () => {
    expect(payloads.length).toBeGreaterThanOrEqual(50);
    for (const kind of [/<script/i, /\son\w+=/i, /javascript:/i, /<svg/i, /<math/i, /!\[/, /\]\(/, /<!--/, /[\u202a-\u202e\u2066-\u2069]/]) {
      expect(payloads.some((p) => kind.test(p)), String(kind)).toBe(true);
    }
    // Every payload appears in the front-matter of some procedure, not only in the body.
    const values = new Set(files.flatMap((f) => stringsIn(readSource(f.name, f.text).data)));
    const missing = payloads.filter((p) => ![...values].some((v) => v.includes(p)));
    expect(missing).toEqual([]);
  });

  it('passes the check with no errors, so the build publishes it', () => {
    const result = checkSources(files.map((f) => ({ file: f.name, text: f.text })), { today: '2026-12-01' });
    expect(result.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
  });

  it('refuses every payload written as an equipment or interlock tag, so none reaches a page as a name', () => {
    const [first] = files;
    // A payload made only of the characters a tag may hold (such as `__proto__`) is a harmless name.
    const refusable = payloads.filter((p) => !/^[A-Za-z0-9 _./-]*$/.test(p));
    expect(refusable.length).toBeGreaterThan(payloads.length - 5);
    // One check over all of them at once (each file its own id), as a folder of such files would be checked.
    const cases = refusable.flatMap((payload, i) => ([
      ['equipment', first.text.replace(/^equipment:\n  - K-210\n/m, `equipment:\n  - K-210\n  - ${JSON.stringify(payload)}\n`)],
      ['interlock', first.text.replace(/^  - tag: TSHH-210$/m, `  - tag: ${JSON.stringify(`TSHH-210 ${payload}`)}`)],
    ] as const).map(([where, text], j) => {
      expect(text, `${where} tag was placed`).not.toBe(first.text);
      const id = `U2-TAG-${String(i * 2 + j + 1).padStart(3, '0')}`;
      return { where, payload, file: `${id.toLowerCase()}.md`, text: text.replace(/^id: .*$/m, `id: ${id}`) };
    }));
    const result = checkSources(cases.map((c) => ({ file: c.file, text: c.text })), { today: '2026-12-01' });
    for (const c of cases) {
      const rules = result.diagnostics.filter((d) => d.file === c.file && d.severity === 'error').map((d) => d.rule);
      expect(rules, `${c.where}: ${JSON.stringify(c.payload)}`).toContain('name-format');
    }
  }, 120_000);
});

describe('absurd YAML', () => {
  const bomb = ['---', 'a: &a ["lol","lol","lol","lol","lol","lol","lol","lol","lol"]',
    ...'bcdefghi'.split('').map((k, i) => `${k}: &${k} [${Array(9).fill('*' + 'abcdefghi'[i]).join(',')}]`), '---', ''].join('\n');
  const deep = `---\nid: U2-DEEP-001\nsteps: ${'['.repeat(10_000)}${']'.repeat(10_000)}\n---\n`;
  // 1,000 levels of block nesting fit under the file size cap (10,000 would be 50 MB, refused for its size).
  const deepBlock = `---\n${Array.from({ length: 1_000 }, (_, i) => `${' '.repeat(i)}a:`).join('\n')} 1\n---\n`;

  for (const [name, text] of Object.entries({ 'an alias bomb': bomb, '10,000-deep flow nesting': deep, '1,000-deep block nesting': deepBlock })) {
    it(`refuses ${name} through the CLI with one clear diagnostic`, async () => {
      const dir = mkdtempSync(join(tmpdir(), 'stepwright-absurd-'));
      try {
        writeFileSync(join(dir, 'absurd.md'), text);
        const started = performance.now();
        const out = await runCli(['check', 'absurd.md'], dir);
        console.log(`check refused ${name} in ${(performance.now() - started).toFixed(0)} ms`);
        expect(out.code).toBe(1);
        expect(out.stdout).toMatch(/absurd\.md:\d+:\d+/);
        expect(out.stdout).toMatch(/yaml-syntax/);
        expect(out.stdout).toMatch(/could not be expanded|nests deeper than 200 levels/);
        expect(out.stdout + out.stderr).not.toMatch(/\n\s+at |call stack|internal failure/);
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    });
  }
});

describe.skipIf(!haveChromium)('the published manual in Chromium', () => {
  let work: string;
  let site: string;
  let server: Server;
  let base: string;
  let browser: Browser;

  beforeAll(async () => {
    work = mkdtempSync(join(tmpdir(), 'stepwright-injection-'));
    mkdirSync(join(work, 'procedures'));
    for (const f of files) writeFileSync(join(work, 'procedures', f.name), f.text);
    site = join(work, 'dist');
    await build(join(work, 'procedures'), site, { STEPWRIGHT_TODAY: '2026-12-01' });
    const started = await startStaticServer(site, 0, '127.0.0.1');
    server = started.server;
    base = started.url.replace(/\/$/, '');
    browser = await launchBrowser();
  });

  afterAll(async () => {
    await browser?.close();
    await new Promise((done) => (server ? server.close(done) : done(null)));
    if (work) rmSync(work, { recursive: true, force: true });
  });

  it('runs no injected script and makes no outside request on any page that shows procedure text', async () => {
    const all = listPages(site);
    expect(all.filter((p) => /^\/procedures\/[^/]+\/$/.test(p)).length).toBe(files.length);
    // The rule pages document the rules and show nothing of the procedures: the index of rules and one rule page are
    // opened, and any rule page that names one of these procedures is opened too.
    const ruleDocs = all.filter((p) => /^\/rules\/[^/]+\/$/.test(p));
    const showsProcedures = (p: string) => readFileSync(join(site, ...p.split('/'), 'index.html'), 'utf8').includes('U2-INJ-');
    const pages = all.filter((p) => !ruleDocs.includes(p) || p === ruleDocs[0] || showsProcedures(p));
    expect(ruleDocs.length).toBeGreaterThan(50);
    expect(pages.length).toBeGreaterThan(all.length - ruleDocs.length);
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const dialogs: string[] = [];
    const outside: string[] = [];
    const consoleMarks: string[] = [];
    await context.route('**/*', (route) => {
      const url = route.request().url();
      if (url.startsWith(base)) return route.continue();
      outside.push(url);
      return route.abort();
    });
    const problems: string[] = [];
    // One tab for every page, as an operator would browse; handlers name the page being shown.
    const page = await context.newPage();
    let path = '';
    page.on('dialog', (d) => { dialogs.push(`${path}: ${d.type()} ${d.message()}`); void d.dismiss(); });
    page.on('console', (m) => { if (/pwned|alert/i.test(m.text())) consoleMarks.push(`${path}: ${m.text()}`); });
    for (path of pages) {
      const response = await page.goto(`${base}${path}`, { waitUntil: 'load' });
      expect(response?.status(), path).toBe(200);
      // Give timers, animations (SVG onbegin) and autofocus handlers a moment; move the pointer and the focus.
      await page.mouse.move(640, 450);
      await page.keyboard.press('Tab');
      await page.waitForTimeout(100);
      const found = await page.evaluate(inspectPage, new URL(attacker).host);
      problems.push(...found.map((f) => `${path}: ${f}`));
    }
    await context.close();
    expect(dialogs).toEqual([]);
    expect(consoleMarks).toEqual([]);
    expect(outside).toEqual([]);
    expect(problems).toEqual([]);
  }, 240_000);

  it('shows hostile text as text: a script tag in the title reads literally on the page', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    await page.goto(`${base}/procedures/u2-inj-001/`);
    const heading = await page.locator('h1').first().innerText();
    // The first procedure's title carries the first payload, a script element.
    expect(payloads[0]).toBe('<script>alert(1)</script>');
    expect(heading).toContain(`Heat kettle K-210 ${payloads[0]}`);
    await context.close();
  });
});

function listPages(site: string): string[] {
  const out: string[] = [];
  const walk = (dir: string) => {
    for (const name of readdirSync(dir).sort()) {
      const full = join(dir, name);
      if (statSync(full).isDirectory()) walk(full);
      else if (name === 'index.html') out.push(`/${relative(site, dir).split('\\').join('/')}${dir === site ? '' : '/'}`.replace(/^\/\/$/, '/'));
    }
  };
  walk(site);
  return out;
}

function stringsIn(value: unknown): string[] {
  if (typeof value === 'string') return [value];
  if (Array.isArray(value)) return value.flatMap(stringsIn);
  if (value && typeof value === 'object') return Object.entries(value).flatMap(([k, v]) => [k, ...stringsIn(v)]);
  return [];
}

/** Runs in the page: anything left of the payloads that could run code or load from another host. */
function inspectPage(attackerHost: string): string[] {
  const out: string[] = [];
  if ((window as unknown as { __swPwned?: unknown }).__swPwned !== undefined) out.push('marker set');
  for (const el of document.querySelectorAll('*')) {
    for (const attr of el.getAttributeNames()) {
      const value = el.getAttribute(attr) ?? '';
      if (/^on/i.test(attr)) out.push(`<${el.localName} ${attr}="${value.slice(0, 40)}">`);
      if (/^(href|src|action|formaction|data|xlink:href|srcdoc|background|poster)$/i.test(attr) && /^(javascript|vbscript|data:text\/html)/i.test(value.replace(/[\u0000-\u0020]/g, ''))) out.push(`<${el.localName} ${attr}="${value.slice(0, 40)}">`);
      if (/^(src|srcset|background|poster|data|action)$/i.test(attr) && value.includes(attackerHost)) out.push(`<${el.localName} ${attr}="${value.slice(0, 60)}">`);
    }
  }
  // The site's own pages use no frames, embedded objects, base or refresh; its scripts and styles name no payload.
  for (const el of document.querySelectorAll('iframe, object, embed, base, meta[http-equiv], link[href*="attacker"]')) out.push(`<${el.localName}> element`);
  for (const s of document.querySelectorAll('script, style')) if (/alert\(|__swPwned|attacker\.invalid/.test(s.textContent ?? '')) out.push(`injected <${s.localName}> text`);
  return out;
}
