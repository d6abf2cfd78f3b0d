// Set up before every test file: the temporary folders its tests made with tempFolder() go when the file ends,
// after the file's own afterAll hooks (which may still stop a server that serves from one).
import { afterAll } from 'vitest';
import { removeTempFolders } from './temp-folder.ts';

afterAll(() => removeTempFolders());
