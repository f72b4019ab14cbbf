/// <reference types="vitest/config" />
import { getViteConfig } from 'astro/config';

// Three suites, run in this order by `npm test`:
//   unit — pure cores and repositories against a real SQLite file, in-process;
//   api  — the built server started on a free port with its own SQLite file;
//   e2e  — the built server driven through Debian's Chromium.
export default getViteConfig({
  test: {
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          include: ['tests/lib/**/*.test.ts', 'tests/data-samples/**/*.test.ts', 'tests/scripts/**/*.test.ts'],
          setupFiles: ['tests/helpers/temp-data-dir.ts'],
        },
      },
      {
        extends: true,
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts'],
          globalSetup: ['tests/helpers/global-server.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
          // One file at a time: they share one server and its single terrain worker, and a file
          // waiting on its terrain run should not queue behind another file's uploads.
          pool: 'forks',
          poolOptions: { forks: { singleFork: true } },
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          globalSetup: ['tests/helpers/global-server.ts'],
          testTimeout: 60_000,
          hookTimeout: 90_000,
          // One browser suite at a time: two Chromiums on two cores only slow each other down.
          pool: 'forks',
          poolOptions: { forks: { singleFork: true } },
        },
      },
    ],
  },
});
