// Words that say a hazard hurts people, and which of them mean death or serious injury.
import type { Sentence } from './words.ts';

/** Harm to people (any degree). Common practice: the injury vocabulary of safety data sheets and incident reports. */
const injury = /^(injur\w*|burns?|burned|burnt|scald\w*|death|deaths|dead|die|dies|fatal\w*|kill\w*|blind\w*|poison\w*|asphyxia\w*|suffocat\w*|amputat\w*|crush\w*|lacerat\w*|irritat\w*|dermatitis|rash|frostbite|electrocut\w*|sensitis\w*|sensitiz\w*|unconscious\w*|choking|drowning)$/i;
/** Death or serious injury: the range of DANGER and WARNING. */
const serious = /^(death|deaths|dead|die|dies|fatal\w*|kill\w*|blind\w*|amputat\w*|asphyxia\w*|suffocat\w*|electrocut\w*|unconscious\w*|drowning)$/i;
const seriousPairs = [['serious', 'injur'], ['severe', 'burn'], ['severe', 'injur'], ['permanent', '']];

export function harmWords(sentences: Sentence[]): string[] {
  return sentences.flatMap((s) => s.words.filter((w) => injury.test(w.text)).map((w) => w.text));
}

export function seriousHarmWords(sentences: Sentence[]): string[] {
  const out: string[] = [];
  for (const s of sentences) {
    s.words.forEach((w, i) => {
      if (serious.test(w.text)) out.push(w.text);
      const next = s.words[i + 1]?.lower ?? '';
      for (const [a, b] of seriousPairs) if (w.lower === a && next.startsWith(b) && next) out.push(`${w.text} ${s.words[i + 1].text}`);
    });
  }
  return out;
}
