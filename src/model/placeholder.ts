// The marker `stepwright new` writes where the author must fill something in, and how to recognise it.

/** Upper-case TODO as a word: "TODO: say what…", or inside a placeholder tag such as TODO-TI. */
export const placeholderMarker = 'TODO';
const markerPattern = /(?<![A-Za-z0-9])TODO(?![A-Za-z0-9])/;

export function isPlaceholder(text: string): boolean {
  // Most text holds no marker at all: a plain search answers it before the pattern is tried.
  return text.includes(placeholderMarker) && markerPattern.test(text);
}
