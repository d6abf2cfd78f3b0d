// Reports a procedure that handles a chemical or an item of equipment for which the plant register states
// hazards, without a hazard message of its own about it at the level the register calls for.
import { hazardStatements, levelRank, type HazardStatement } from '../../analysis/ghs-hazards.ts';
import type { HazardLevel, Procedure } from '../../model/procedure.ts';
import type { PlantRegister, RegisterChemical, RegisterEquipment } from '../../model/register.ts';
import { contentSeverity } from '../content-severity.ts';
import { defineFileRule } from '../define-rule.ts';
import { emergencyKinds } from '../../model/kinds.ts';


interface Need {
  level: HazardLevel;
  why: string;
  place?: { file: string; path: (string | number)[] };
}

export default defineFileRule(
  {
    id: 'register-hazard-not-stated',
    summary: 'The procedure handles a chemical or equipment with hazards in the plant register, but states no hazard about it at that level.',
    category: 'safety',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1)(iii): safety and health considerations, properties of and hazards presented by the chemicals used; GHS (UN) hazard statements; ANSI Z535.6 signal words',
    docs: `The plant register holds what is known about each chemical (its GHS hazard statement codes) and may hold
hazards of equipment (\`hazards\` under an equipment item or a chemical, each with a level). A procedure that
handles the item — it lists it under \`uses\` or \`equipment\` — must warn of it: one of its \`hazards\` names the item
(its tag, its id or its name) at the level the register calls for, or above.

For chemicals the level follows from the hazard statements: WARNING where the harm can be death or serious
injury (flammable liquids, toxic, corrosive, serious eye damage H318, respiratory sensitisers H334, carcinogens),
CAUTION for harmful, irritant and skin-sensitising codes; codes that harm only the environment ask for nothing
here. A register hazard with a \`when\` condition is not asked for here: hazard-can-occur checks that no step of the
procedure can reach it. In \`emergency\` and \`emergency-shutdown\` procedures a register NOTICE does not apply.
A code the checker does not know (an EU-only EUH code, a mistyped code) is reported as information: the level it
calls for was not checked.

Fix it by adding the hazard to the procedure (level, hazard naming the item, consequence, how to avoid it), or by
raising the level of the one it has.`,
    examples: {
      bad: "uses: [phthalic-anhydride]   # register: H318, H334\nhazards:\n  - { level: caution, hazard: Phthalic anhydride dust, ... }",
      good: "uses: [phthalic-anhydride]\nhazards:\n  - { level: warning, hazard: Phthalic anhydride dust, a respiratory sensitiser, consequence: Serious eye damage and asthma, ... }",
    },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p || !ctx.register || !p.registerUses) return;
    const seen = new Set<string>();
    for (const use of p.registerUses) {
      const entry = use.entry;
      if (!entry || seen.has(entry.id) || (entry.section !== 'chemicals' && entry.section !== 'equipment')) continue;
      seen.add(entry.id);
      const unknown = entry.section === 'chemicals' ? unknownCodes(entry.hazardStatements) : [];
      if (entry.section === 'chemicals' && unknown.length) {
        ctx.report({
          path: use.path,
          severity: 'info',
          message: `The plant register gives ${entry.name} the code${unknown.length > 1 ? 's' : ''} ${unknown.join(', ')}, which the checker does not know; the hazard level ${unknown.length > 1 ? 'they call' : 'it calls'} for was not checked.`,
          hint: 'Check the code against the safety data sheet (GHS hazard statements run from H200 to H420); if it is right, make sure a hazard of this procedure states it at the level it needs.',
        });
      }
      const needs = needsOf(entry).filter((n) => !(emergencyKinds.has(p.kind) && n.level === 'notice'));
      if (!needs.length) continue;
      const highest = needs.reduce((a, b) => (levelRank[b.level] > levelRank[a.level] ? b : a));
      const names = namesOf(entry);
      const stated = p.hazards.filter((h) => mentions(`${h.hazard} ${h.consequence ?? ''} ${h.avoid ?? ''}`, names));
      const best = stated.reduce<HazardLevel | undefined>((a, h) => (a === undefined || levelRank[h.level] > levelRank[a] ? h.level : a), undefined);
      if (best !== undefined && levelRank[best] >= levelRank[highest.level]) continue;
      const what = entry.section === 'chemicals' ? `chemical ${entry.name}` : `${entry.text} ${entry.id}`;
      const reasons = needs.filter((n) => n.level === highest.level).map((n) => n.why).join('; ');
      ctx.report({
        path: use.path,
        severity: contentSeverity(String(p.status)),
        message: best === undefined
          ? `The procedure handles ${what}, for which the plant register gives ${reasons}, but none of its hazards is about it.`
          : `The procedure warns of ${what} only at ${best.toUpperCase()}; the plant register gives ${reasons}, which calls for ${highest.level.toUpperCase()} or higher.`,
        hint: best === undefined
          ? `Add a hazard that names ${entry.section === 'chemicals' ? entry.name : entry.id}, at level ${highest.level} or higher, with its consequence and how to avoid it.`
          : `Raise the level of the hazard about ${entry.section === 'chemicals' ? entry.name : entry.id} to ${highest.level} or higher.`,
        related: highest.place ? [{ file: highest.place.file, range: sourceRange(ctx.register, highest.place), message: 'the hazard in the plant register' }] : undefined,
      });
    }
  },
);

/** The codes (or parts of combined codes) that the hazard statement table does not hold. */
function unknownCodes(codes: string[]): string[] {
  return codes.flatMap((code) => code.split('+').map((c) => c.trim()).filter((c) => hazardStatements(c).length === 0));
}

function needsOf(entry: RegisterChemical | RegisterEquipment): Need[] {
  const out: Need[] = [];
  if (entry.section === 'chemicals') {
    const statements: HazardStatement[] = entry.hazardStatements.flatMap(hazardStatements).filter((s) => s.least !== 'notice');
    for (const s of statements) out.push({ level: s.least, why: `${s.code} (${s.words})`, place: { file: entry.file, path: [...entry.path, 'hazard-statements'] } });
  }
  for (const h of entry.hazards) {
    if (h.when) continue;
    out.push({ level: h.level, why: `${h.level.toUpperCase()} '${h.hazard}'`, place: { file: entry.file, path: h.path } });
  }
  return out;
}

const generic = new Set(['mixed', 'isomers', 'solution', 'technical', 'anhydrous', 'liquid', 'solid', 'powder']);

/** The words by which a hazard message can name the item. */
function namesOf(entry: RegisterChemical | RegisterEquipment): string[] {
  if (entry.section === 'equipment') return [entry.id];
  const name = entry.name.replace(/\([^)]*\)/g, ' ').replace(/\s+/g, ' ').trim();
  const words = name.split(/[\s,/-]+/).filter((w) => w.length >= 6 && !generic.has(w.toLowerCase()));
  return [...new Set([entry.id, entry.id.replace(/-/g, ' '), name, ...words].filter(Boolean))];
}

function mentions(text: string, names: string[]): boolean {
  return names.some((n) => new RegExp(`(^|[^A-Za-z0-9])${n.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}($|[^A-Za-z0-9])`, 'i').test(text));
}

function sourceRange(register: PlantRegister, place: { file: string; path: (string | number)[] }) {
  const source = register.sources.find((s) => s.file === place.file)?.source;
  return source ? source.rangeOf(place.path) : { line: 1, column: 1, endLine: 1, endColumn: 1 };
}
