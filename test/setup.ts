/** Runs in every test file: the temporary folders of tempDir() do not outlive their test or file. */
import { afterAll, afterEach } from 'vitest';
import { removeTempDirs } from './temp-dirs.js';

afterEach(() => removeTempDirs('test'));
afterAll(() => removeTempDirs('file'));
