// Reports a procedure that handles a chemical whose hazard statements call for eye, skin or respiratory
// protection that its `ppe` list does not name.
import { hazardStatements } from '../../analysis/ghs-hazards.ts';
import { contentSeverity } from '../content-severity.ts';
import { defineFileRule } from '../define-rule.ts';

interface Protection {
  what: string;
  codes: Set<string>;
  words: RegExp;
  example: string;
}

/** Which protection the codes call for, and the words by which a PPE list names it. */
const protections: Protection[] = [
  { what: 'eye protection against splashes or dust (goggles or a face shield)', codes: new Set(['H314', 'H318']), words: /goggle|face ?shield|visor|full[- ]face/i, example: 'Chemical goggles' },
  { what: 'eye protection (safety glasses, goggles or a face shield)', codes: new Set(['H319']), words: /goggle|face ?shield|visor|glasses|spectacles|full[- ]face/i, example: 'Safety glasses with side shields' },
  { what: 'chemical-resistant gloves', codes: new Set(['H310', 'H311', 'H314']), words: /glove|gauntlet/i, example: 'Chemical-resistant gloves' },
  { what: 'respiratory protection', codes: new Set(['H330', 'H331', 'H334']), words: /respirator|breathing apparatus|\bBA\b|SCBA|mask|FFP\d|\bP3\b|air[- ]fed/i, example: 'FFP3 dust respirator' },
];

export default defineFileRule(
  {
    id: 'ppe-missing-for-chemical',
    summary: "The procedure handles a chemical whose hazard statements call for eye, skin or respiratory protection that 'ppe' does not list.",
    category: 'safety',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1)(iii)(B): precautions to prevent exposure, including personal protective equipment; GHS (UN) Annex 4, safety data sheet section 8 (exposure controls and personal protection); the mapping of codes to protection is common practice',
    docs: `The plant register gives each chemical its GHS hazard statement codes. A procedure that handles the chemical
(lists it under \`uses\`) must list the protection those codes call for under \`ppe\`:

| codes | protection | a \`ppe\` item that counts |
| --- | --- | --- |
| H314 (severe burns and eye damage), H318 (serious eye damage) | goggles or a face shield | *Chemical goggles*, *Face shield* |
| H319 (serious eye irritation) | eye protection | *Safety glasses with side shields* |
| H310, H311 (fatal or toxic on skin), H314 | chemical-resistant gloves | *Nitrile gloves*, *gauntlets* |
| H330, H331 (fatal or toxic if inhaled), H334 (respiratory sensitiser) | respiratory protection | *FFP3 respirator*, *breathing apparatus* |

The safety data sheet and the site's own assessment decide the exact equipment; the rule only checks that the
kind of protection is there. Where an engineering control makes a kind unnecessary (a closed charging system),
waive the rule with that reason.`,
    examples: {
      bad: 'uses: [phthalic-anhydride]   # H318, H334\nppe: [Safety boots, Safety glasses]',
      good: 'uses: [phthalic-anhydride]\nppe: [Safety boots, Chemical goggles, FFP3 dust respirator]',
    },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p || !p.registerUses) return;
    const seen = new Set<string>();
    for (const use of p.registerUses) {
      const entry = use.entry;
      if (entry?.section !== 'chemicals' || seen.has(entry.id)) continue;
      seen.add(entry.id);
      const codes = entry.hazardStatements.flatMap(hazardStatements).map((s) => s.code.slice(0, 4));
      const missing: Array<{ need: Protection; why: string[] }> = [];
      for (const need of protections) {
        const why = [...new Set(codes.filter((c) => need.codes.has(c)))];
        if (!why.length || p.ppe.some((item) => need.words.test(item))) continue;
        // Goggles asked for by H314/H318 also cover H319: the eyes are reported once.
        if (need.codes.has('H319') && codes.some((c) => c === 'H314' || c === 'H318')) continue;
        missing.push({ need, why });
      }
      if (!missing.length) continue;
      ctx.report({
        path: use.path,
        severity: contentSeverity(String(p.status)),
        message: `${entry.name} calls for ${missing.map((m) => `${m.need.what} (${m.why.join(', ')})`).join(' and ')}, which the procedure's ppe does not list.`,
        hint: `Add ${missing.map((m) => `'${m.need.example}'`).join(' and ')} (or what the safety data sheet specifies) to 'ppe', or waive this rule with the engineering control that makes it unnecessary.`,
      });
    }
  },
);
