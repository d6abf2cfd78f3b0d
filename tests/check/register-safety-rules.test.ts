// Hazard statement codes and the least signal word a procedure's hazard needs for them.
import { describe, expect, it } from 'vitest';
import { hazardStatements } from '../../src/analysis/ghs-hazards.ts';
import { rules } from '../../src/check/rules/index.ts';

const least = (code: string) => hazardStatements(code).map((s) => s.least);

describe('GHS hazard statements', () => {
  it('grades harm that can kill or seriously injure as WARNING at least', () => {
    // Source: GHS (UN), Annex 3: H226 flammable liquid and vapour; H304 may be fatal if swallowed and enters airways;
    // H318 causes serious eye damage; H334 may cause allergy or asthma symptoms or breathing difficulties if inhaled
    // Source: ANSI Z535.6: WARNING could result in death or serious injury; CAUTION in minor or moderate injury
    for (const code of ['H226', 'H304', 'H314', 'H318', 'H330', 'H334', 'H350']) expect(least(code), code).toEqual(['warning']);
  });

  it('grades harmful and irritant codes as CAUTION, and environmental codes as NOTICE', () => {
    // Source: GHS (UN), Annex 3: H302 harmful if swallowed; H315 causes skin irritation; H335 may cause respiratory irritation; H410 very toxic to aquatic life
    for (const code of ['H302', 'H315', 'H317', 'H319', 'H335']) expect(least(code), code).toEqual(['caution']);
    expect(least('H410')).toEqual(['notice']);
  });

  it('knows the GHS codes that the EU CLP regulation does not adopt, and the desensitised explosives', () => {
    // Source: GHS (UN), Annex 3, tables A3.1.2 and A3.1.3: H303, H305, H313, H316, H320, H333 (lower acute and
    // irritation categories) and H401, H402 (acute aquatic 2 and 3) — listed from memory
    for (const code of ['H303', 'H305', 'H313', 'H316', 'H320', 'H333']) expect(least(code), code).toEqual(['caution']);
    for (const code of ['H401', 'H402']) expect(least(code), code).toEqual(['notice']);
    // Source: EU CLP Regulation (EC) 1272/2008, Annex I, Table 2.17.2: H206, H207, H208 desensitised explosives
    for (const code of ['H206', 'H207', 'H208']) expect(least(code), code).toEqual(['warning']);
    // Source: GHS (UN), Annex 3, table A3.1.1: H232 pyrophoric gas; H282, H283 flammable chemicals under pressure — from memory
    for (const code of ['H232', 'H282', 'H283']) expect(least(code), code).toEqual(['warning']);
    // A gas container that bursts when heated can kill: WARNING in the ANSI Z535.6 sense (GHS's own signal word for
    // H280 is 'Warning', a different scale). Source: ANSI Z535.6; GHS (UN) Annex 3, H280, H284 — common practice
    for (const code of ['H280', 'H284']) expect(least(code), code).toEqual(['warning']);
    // EU-only supplementary codes are not GHS hazard statements: not in the table (reported as not checked).
    expect(hazardStatements('EUH066')).toEqual([]);
  });

  it('grades acute toxicity by category: categories 1 to 3 WARNING, category 4 CAUTION', () => {
    // Source: EU CLP Regulation (EC) 1272/2008, Annex I, Table 3.1.3 (acute toxicity label elements): oral H300
    // (cat. 1-2), H301 (cat. 3), H302 (cat. 4); dermal H310, H311, H312; inhalation H330, H331, H332
    for (const code of ['H300', 'H301', 'H310', 'H311', 'H330', 'H331']) expect(least(code), code).toEqual(['warning']);
    for (const code of ['H302', 'H312', 'H332']) expect(least(code), code).toEqual(['caution']);
    // Source: EU CLP Regulation (EC) 1272/2008, Annex I, Table 2.5.2: H280 contains gas under pressure; H281 refrigerated gas
    expect(hazardStatements('H280')[0]?.words).toMatch(/gas under pressure/);
    expect(hazardStatements('H281')[0]?.words).toMatch(/refrigerated gas/);
  });

  it('reads combined codes and sub-categories, and gives nothing for an unknown code', () => {
    // Source: GHS (UN), Annex 3, combined statements such as H301+H311; CLP sub-categories such as H360FD
    expect(hazardStatements('H301+H311').map((s) => s.code)).toEqual(['H301', 'H311']);
    expect(least('H360FD')).toEqual(['warning']);
    expect(hazardStatements('H999')).toEqual([]);
  });

  it('the register hazard rule cites its sources', () => {
    // Source: OSHA 29 CFR 1910.119(f)(1)(iii), safety and health considerations of the chemicals used
    expect(rules['register-hazard-not-stated'].meta.source).toMatch(/1910\.119\(f\)\(1\)\(iii\).*GHS/);
  });
});

describe('trip tests', () => {
  it('the trip-test rule cites its sources', () => {
    // Source: OSHA 29 CFR 1910.119(j)(4) inspection and testing; IEC 61511-1 clause 16.3 proof testing (from memory)
    expect(rules['trip-test-incomplete'].meta.source).toMatch(/1910\.119\(j\)\(4\).*IEC 61511-1.*from memory/);
  });
});

describe('high-level trips', () => {
  it('the high-level trip rule cites its sources', () => {
    // Source: ISA-5.1 (first letter L = level); overfill protection isolates the feed: common practice (HSE HSG176, from memory)
    expect(rules['high-level-trip-misses-feed'].meta.source).toMatch(/ISA-5\.1.*common practice.*from memory/);
  });
});

describe('protective equipment for chemicals', () => {
  it('cites its sources', () => {
    // Source: OSHA 29 CFR 1910.119(f)(1)(iii)(B) PPE among the precautions; GHS (UN) Annex 4, SDS section 8
    expect(rules['ppe-missing-for-chemical'].meta.source).toMatch(/1910\.119\(f\)\(1\)\(iii\)\(B\).*GHS.*Annex 4/);
  });
  it('asks goggles for serious eye damage and a respirator for a respiratory sensitiser', () => {
    // Source: GHS (UN) Annex 3, precautionary statement P280 (wear eye protection/face protection) for H318, P284 (wear respiratory protection) for H334 (from memory)
    const docs = rules['ppe-missing-for-chemical'].meta.docs;
    expect(docs).toMatch(/H318 \(serious eye damage\) \| goggles or a face shield/);
    expect(docs).toMatch(/H334 \(respiratory sensitiser\) \| respiratory protection/);
  });
});
