// What a GHS hazard statement code says, in short words, and the least signal word a procedure's own hazard
// message needs for it: WARNING where the harm can be death or serious injury, CAUTION where it is minor or
// moderate, NOTICE where only the environment or property is harmed. The codes are those of the GHS (UN), Annex 3,
// tables A3.1.1 (physical), A3.1.2 (health) and A3.1.3 (environmental), including the ones the EU CLP regulation
// does not adopt (H303, H305, H313, H316, H320, H333, H401, H402). The words are our own short paraphrase, listed
// from memory; the physical codes H200-H231, the desensitised explosives H206-H208, the gases H280/H281 and the acute
// toxicity codes were compared with public texts of the GHS list and the CLP Annex I tables, the rest were not. The
// grading is ours, following the ANSI Z535 meaning of the signal words. A code not in the table is reported by the
// rules that read it as not checked.
import type { HazardLevel } from '../model/procedure.ts';

export interface HazardStatement {
  code: string;
  /** The hazard in a few words. */
  words: string;
  least: HazardLevel;
}

const table: Record<string, [string, HazardLevel]> = {
  H200: ['unstable explosive', 'warning'], H201: ['explosive, mass explosion hazard', 'warning'],
  H202: ['explosive, severe projection hazard', 'warning'], H203: ['explosive, fire, blast or projection hazard', 'warning'],
  H204: ['fire or projection hazard', 'warning'], H205: ['may mass explode in fire', 'warning'],
  H206: ['fire, blast or projection hazard; more explosive if the desensitising agent is reduced', 'warning'],
  H207: ['fire or projection hazard; more explosive if the desensitising agent is reduced', 'warning'],
  H208: ['fire hazard; more explosive if the desensitising agent is reduced', 'warning'],
  H220: ['extremely flammable gas', 'warning'], H221: ['flammable gas', 'warning'], H222: ['extremely flammable aerosol', 'warning'],
  H223: ['flammable aerosol', 'warning'], H224: ['extremely flammable liquid and vapour', 'warning'],
  H225: ['highly flammable liquid and vapour', 'warning'], H226: ['flammable liquid and vapour', 'warning'],
  H227: ['combustible liquid', 'caution'], H228: ['flammable solid', 'warning'], H229: ['pressurised container, may burst if heated', 'caution'],
  H230: ['may react explosively even without air', 'warning'], H231: ['may react explosively at raised pressure or temperature', 'warning'],
  H232: ['may catch fire by itself in air (pyrophoric gas)', 'warning'],
  H240: ['heating may cause an explosion', 'warning'], H241: ['heating may cause a fire or explosion', 'warning'],
  H242: ['heating may cause a fire', 'warning'], H250: ['catches fire spontaneously in air', 'warning'],
  H251: ['self-heating, may catch fire', 'warning'], H252: ['self-heating in large quantities, may catch fire', 'warning'],
  H260: ['releases flammable gases with water that may ignite', 'warning'], H261: ['releases flammable gas with water', 'warning'],
  H270: ['may cause or intensify fire (oxidiser)', 'warning'], H271: ['may cause fire or explosion (strong oxidiser)', 'warning'],
  H272: ['may intensify fire (oxidiser)', 'warning'], H280: ['gas under pressure, may explode if heated', 'warning'],
  H281: ['refrigerated gas, cryogenic burns', 'warning'], H282: ['extremely flammable chemical under pressure, may explode if heated', 'warning'],
  H283: ['flammable chemical under pressure, may explode if heated', 'warning'], H284: ['chemical under pressure, may explode if heated', 'warning'],
  H290: ['may be corrosive to metals', 'notice'],
  H300: ['fatal if swallowed', 'warning'], H301: ['toxic if swallowed', 'warning'], H302: ['harmful if swallowed', 'caution'],
  H303: ['may be harmful if swallowed', 'caution'], H305: ['may be harmful if swallowed and enters airways', 'caution'],
  H304: ['may be fatal if swallowed and enters airways', 'warning'], H310: ['fatal in contact with skin', 'warning'],
  H311: ['toxic in contact with skin', 'warning'], H312: ['harmful in contact with skin', 'caution'],
  H313: ['may be harmful in contact with skin', 'caution'], H316: ['mild skin irritation', 'caution'],
  H320: ['eye irritation', 'caution'], H333: ['may be harmful if inhaled', 'caution'],
  H314: ['severe skin burns and eye damage', 'warning'], H315: ['skin irritation', 'caution'],
  H317: ['may cause an allergic skin reaction', 'caution'], H318: ['serious eye damage', 'warning'],
  H319: ['serious eye irritation', 'caution'], H330: ['fatal if inhaled', 'warning'], H331: ['toxic if inhaled', 'warning'],
  H332: ['harmful if inhaled', 'caution'], H334: ['respiratory sensitiser, may cause allergy or asthma symptoms if inhaled', 'warning'],
  H335: ['may cause respiratory irritation', 'caution'], H336: ['may cause drowsiness or dizziness', 'caution'],
  H340: ['may cause genetic defects', 'warning'], H341: ['suspected of causing genetic defects', 'warning'],
  H350: ['may cause cancer', 'warning'], H351: ['suspected of causing cancer', 'warning'],
  H360: ['may damage fertility or the unborn child', 'warning'], H361: ['suspected of damaging fertility or the unborn child', 'warning'],
  H362: ['may harm breast-fed children', 'warning'], H370: ['causes damage to organs', 'warning'],
  H371: ['may cause damage to organs', 'caution'], H372: ['causes damage to organs through repeated exposure', 'warning'],
  H373: ['may cause damage to organs through repeated exposure', 'caution'],
  H400: ['very toxic to aquatic life', 'notice'], H401: ['toxic to aquatic life', 'notice'], H402: ['harmful to aquatic life', 'notice'],
  H410: ['very toxic to aquatic life with long-lasting effects', 'notice'],
  H411: ['toxic to aquatic life with long-lasting effects', 'notice'], H412: ['harmful to aquatic life with long-lasting effects', 'notice'],
  H413: ['may cause long-lasting harmful effects to aquatic life', 'notice'], H420: ['harms the ozone layer', 'notice'],
};

export const levelRank: Record<HazardLevel, number> = { notice: 0, caution: 1, warning: 2, danger: 3 };

/** The statements a code (or a combined code such as H301+H311) stands for; unknown codes give nothing. */
export function hazardStatements(code: string): HazardStatement[] {
  return code.split('+').flatMap((part) => {
    // Sub-categories such as H360FD read as their base code.
    const base = /^H\d{3}/.exec(part.trim())?.[0];
    const found = base ? table[base] : undefined;
    return found ? [{ code: part.trim(), words: found[0], least: found[1] }] : [];
  });
}
