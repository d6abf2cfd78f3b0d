// What each folder of pages is made from, as one hash per folder: a procedure's page with the next/, audit/ and rev/
// pages under its folder, one tag's page or one later part of its list, one register entry's page, one rule's page.
// They come out the same whenever their key does, so a build may keep them from its last output (cli/page-reuse.ts).
// A folder inside another one with a key of its own (a tag's later parts) is its own folder. The key errs towards drawing
// again: it holds everything those pages read, and for the parts that come from other procedures (calls, callers,
// required procedures, temporary procedures, register entries, tag pages) their whole source text, not only the few
// words shown. The procedure's own view goes in without the parts made on demand (step table, body, emergency lead):
// those follow from its text and the code, both in the key, and making them here would make them for every procedure
// of a rebuild that draws few.
import { callSitesOf } from '../analysis/inline-calls.ts';
import type { Procedure } from '../model/procedure.ts';
import { manualIndex } from './manual-index.ts';
import { withoutDrawnParts } from '../render/manual.ts';
import type { LoadedManual } from './manual.ts';
import { historiesOf } from './history.ts';
import { registerOf } from './register.ts';
import { temporariesOf } from './temporary.ts';
import { cacheKey } from '../check/result-cache.ts';
import { rules } from '../check/rules/index.ts';
import { pageFolder, pagePath } from '../render/site-url.ts';
import { registerEntryUrl } from '../render/register-view.ts';
import { tagParts } from '../render/tag-parts.ts';

/** Bumped when what goes into a key changes. */
const keyFormat = 'stepwright-page-key-4';

/** JSON for hashing: maps and sets as lists, functions left out, parsed models (`procedure`) left to their text. */
function stableJson(value: unknown): string {
  return JSON.stringify(value, (key, v: unknown) => {
    if (key === 'procedure' && v && typeof v === 'object' && 'steps' in v) return undefined;
    if (v instanceof Map) return [...v.entries()];
    if (v instanceof Set) return [...v.values()];
    return v;
  }) ?? 'undefined';
}

/** The hash of the parts, each framed by its length (the cache's own keys). */
function digest(parts: string[]): string {
  return cacheKey([keyFormat, ...parts]);
}

/**
 * Page folder → the key of its pages. `salt` names the code that draws the pages (Stepwright and the packages
 * it draws with); the rest comes from the manual the build has loaded (and hands to the pages).
 */
export async function pageKeys(loaded: LoadedManual, salt: string): Promise<Map<string, string>> {
  const view = loaded.view;
  if (!view) throw new Error('the manual has check errors; no page is drawn');
  const index = manualIndex(loaded, view);
  const histories = await historiesOf(loaded);
  const register = await registerOf(loaded);
  const temporaries = temporariesOf(loaded, view);
  const texts = new Map<string, string>();
  for (const input of loaded.inputs) if ('text' in input) texts.set(input.file, input.text);
  const procedureFiles = new Set(texts.keys());
  // The same on every page: the code, where and when the manual is built, the configuration and the register's
  // own files, the register's pages and the list of tag pages (a tag's page name can depend on other tags).
  const others = [...loaded.run.texts.entries()].filter(([file]) => !procedureFiles.has(file)).sort(([a], [b]) => a.localeCompare(b));
  const shared = digest([
    salt, loaded.root, loaded.today, loaded.todaySource, loaded.base, stableJson(loaded.run.config),
    stableJson(others), stableJson(register?.view.urlOf ?? []), stableJson(view.tags.map((t) => [t.tag, t.url])),
  ]);
  const textOf = (id: string) => {
    const file = index.fileOf(id)?.file;
    return file === undefined ? '\u0000not in the manual' : `${file}\u0000${texts.get(file) ?? ''}`;
  };
  // Each procedure's register entries, each with that procedure's own uses only, in the register's order.
  const entriesUsedBy = new Map<string, NonNullable<typeof register>['view']['entries']>();
  for (const e of register?.view.entries ?? []) {
    const byProcedure = new Map<string, typeof e.usedBy>();
    for (const u of e.usedBy) byProcedure.set(u.procedure.id, [...(byProcedure.get(u.procedure.id) ?? []), u]);
    for (const [id, own] of byProcedure) entriesUsedBy.set(id, [...(entriesUsedBy.get(id) ?? []), { ...e, usedBy: own }]);
  }
  const keys = new Map<string, string>();
  for (const p of view.procedures) {
    const checked = index.fileOf(p.id);
    const history = histories.get(p.id);
    // Everything a call can reach, in every revision the pages show (a revision in force may call what the
    // newest text no longer does), and every procedure that calls this one or that it requires.
    const related = new Set<string>();
    const reach = (callees: Iterable<string>) => {
      for (const id of callees) {
        if (related.has(id)) continue;
        related.add(id);
        const callee = index.procedureOf(id);
        if (callee) reach(callSitesOf(callee).map((site) => site.callee));
      }
    };
    if (checked?.procedure) reach(callSitesOf(checked.procedure).map((site) => site.callee));
    for (const entry of history?.revisions ?? []) reach(entry.calls);
    for (const site of index.calls.callers.get(p.id) ?? []) related.add(site.caller);
    for (const required of p.requires) related.add(required.id);
    const ownNotices = temporaries.byProcedure.get(p.id) ?? [];
    for (const notice of ownNotices) {
      related.add(notice.id);
      for (const m of notice.modifies) related.add(m.id);
    }
    related.delete(p.id);
    const neighbours = [...related].sort().map((id) => `${id}\u0000${textOf(id)}\u0000${index.viewOf(id)?.url ?? ''}`);
    keys.set(pageFolder(pagePath.procedure(p.slug)), digest([
      shared, p.slug, stableJson(withoutDrawnParts(p)), textOf(p.id),
      stableJson(checked?.diagnostics ?? []), stableJson(checked?.waived ?? []),
      stableJson(history ?? null), stableJson(ownNotices),
      // The register entries it uses, each with its own uses only: another procedure's use of an entry is not shown here.
      stableJson(register?.view.indexUrl ?? ''),
      stableJson(entriesUsedBy.get(p.id) ?? []),
      ...neighbours,
    ]));
  }
  // A tag's page, and each later part of its list, shows the tag's roles, how many procedures use it, the links to
  // the parts and the part's own uses: each procedure's id, title, status and revision, and the steps that touch it.
  for (const t of view.tags) {
    for (const part of tagParts(t)) keys.set(pageFolder(pagePath.tagPart(t.slug, part.number)), digest([shared, 'tag', stableJson(part)]));
  }
  // A register entry's page shows the entry, where it is used, its changes in git and whether each user was revised since.
  if (register) {
    for (const e of register.view.entries) {
      keys.set(pageFolder(registerEntryUrl(e.id, e.slug)), digest([
        shared, 'register', stableJson(e), stableJson(register.history.get(e.id) ?? []), stableJson(register.impact.get(e.id) ?? null), register.historyNotice ?? '',
      ]));
    }
  }
  // A rule's page shows the rule as the code defines it.
  for (const id of Object.keys(rules)) keys.set(pageFolder(pagePath.rule(id)), digest([shared, 'rule', id]));
  return keys;
}
