// Types of the packing script that writes the units' part of mathjs, for the test that compares it with the whole
// library.

/** Writes the bundle to `outfile` with the licences beside it; resolves to the names of the packages it holds. */
export function writeMathjsUnits(outfile: string): Promise<string[]>;
