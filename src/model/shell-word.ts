// A path or other value written into a command the user is told to run, quoted so that pasting the command runs it
// with that one argument: a folder with a space or a shell character in its name stays one argument.

/** Characters that need no quoting in any common shell (POSIX shells, PowerShell, cmd). */
const plain = /^[A-Za-z0-9_@%+=:,./-]+$/;

/**
 * `word` as one shell argument: unchanged when it needs no quoting, else in double quotes (which POSIX shells,
 * PowerShell and cmd all read the same) unless it holds a character double quotes do not protect in a POSIX shell
 * ($ ` \ " !), then in single quotes, with a single quote inside written as '\''.
 */
export function shellWord(word: string): string {
  if (plain.test(word)) return word;
  if (!/[$`\\"!]/.test(word)) return `"${word}"`;
  return `'${word.replace(/'/g, `'\\''`)}'`;
}
