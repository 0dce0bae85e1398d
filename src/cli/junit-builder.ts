/** The JUnit XML builder package, loaded for report/junit.ts (which stays free of Node's module loader). */
import { createRequire } from 'node:module';
import type { Builder } from 'junit-report-builder';

// The package is CommonJS whose typings declare an ES default export; require gives its real export.
export const junitBuilder = createRequire(import.meta.url)('junit-report-builder') as Builder;
