import { defineConfig } from 'eslint/config';
import tseslint from 'typescript-eslint';

// The pure cores must stay pure: no server code, no Astro virtual modules, no Node built-ins.
const pureCoreImports = {
  patterns: [
    { group: ['**/lib/server/**', '**/server/*'], message: 'The pure cores do no I/O: keep server code out.' },
    { group: ['astro:*'], message: 'The pure cores do not depend on Astro.' },
    { group: ['node:*', 'fs', 'path', 'os', 'child_process', 'http', 'https', 'net', 'worker_threads'], message: 'The pure cores do no I/O.' },
  ],
};

export default defineConfig(
  { ignores: ['dist/', 'node_modules/', '.astro/', 'data/', 'test-output/', 'public/'] },
  ...tseslint.configs.recommended,
  {
    files: ['src/lib/terrain/**', 'src/lib/crossings/**', 'src/lib/geo/**', 'src/lib/work-orders/**'],
    rules: {
      'no-restricted-imports': ['error', pureCoreImports],
      '@typescript-eslint/no-explicit-any': 'error',
    },
  },
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
    },
  },
);
