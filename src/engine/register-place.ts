// Where the plant register folder sits in the repository, for reading it at a commit (review's base, the
// register pages' history).
import { join, relative } from 'node:path';
import type { RegisterAt } from '../history/register-history.ts';
import { repoPath, type Repository } from './repository.ts';

export function registerPlace(repo: Repository, absolute: string, cwd: string): RegisterAt {
  return {
    git: repo.git, folder: repoPath(repo, absolute), shownFolder: relative(cwd, absolute) || '.', shallow: repo.shallow,
    shown: (n) => relative(cwd, join(repo.root, n)).replaceAll('\\', '/'),
  };
}
