/** Runs in every test file: the temporary folders of tempDir() do not outlive their test or file. */
import { afterAll, afterEach, beforeEach } from 'vitest';
import { enterTest, removeTempDirs } from './temp-dirs.js';

beforeEach(() => enterTest());
afterEach(() => removeTempDirs('test'));
afterAll(() => removeTempDirs('file'));
