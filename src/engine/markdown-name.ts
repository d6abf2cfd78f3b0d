// Which file names are procedure files: the one test every place that lists them uses (the folder and glob
// search of check, build, verify and export, the live preview's watcher, review's list of changed files).

/** True for a markdown file name: `.md` in any case (`.MD`, written by some editors and file systems, is the same type). */
export function isMarkdownName(name: string): boolean {
  return /\.md$/i.test(name);
}
