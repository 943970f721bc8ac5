import { builtinModules } from 'node:module';
import { defineConfig, globalIgnores } from 'eslint/config';
import nextVitals from 'eslint-config-next/core-web-vitals';
import nextTs from 'eslint-config-next/typescript';

// lib/science is pure (lib/science/README.md): its files import each other and their npm libraries, nothing
// else. Which relative paths leave lib/science depends on how deep the file sits, so there is one block per
// depth (a file at depth 1 is lib/science/x.ts); a file deeper than the last block gets the first, which
// refuses every `../`.
const SCIENCE_DEPTHS = 6;
const SCIENCE_PURE = 'lib/science is pure: no app code (@/…), no Node built-ins, no framework or database (lib/science/README.md).';
function scienceImports(depth) {
  return [
    'error',
    {
      paths: [...builtinModules, 'server-only', 'next', 'sequelize', 'pg'].map((name) => ({ name, message: SCIENCE_PURE })),
      patterns: [
        { group: ['@/*', 'node:*', 'next/*', 'sequelize/*', 'pg/*'], message: SCIENCE_PURE },
        depth === null
          ? { regex: '^(?:\\./)*\\.\\.(?:/|$)', message: 'Too deep below lib/science for a relative path upwards; add a level to SCIENCE_DEPTHS in eslint.config.mjs.' }
          : { regex: `^(?:\\./)*(?:\\.\\./){${depth - 1}}\\.\\.(?:/|$)`, message: `This path leaves lib/science. ${SCIENCE_PURE}` },
        // `../fit/../../x` and the like: a folder name followed by `..` hides where the path goes.
        { regex: '(?:^|/)(?!\\.\\.?/)[^/]+/(?:.*/)?\\.\\.(?:/|$)', message: 'Write the relative path without `..` after a folder name.' },
      ],
    },
  ];
}
const SCIENCE_FILES = '{ts,tsx,mts,cts,js,mjs,cjs}';

export default defineConfig([
  ...nextVitals,
  ...nextTs,
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
    },
  },
  {
    // sequelize-cli files are CommonJS by the CLI's rule.
    files: ['migrations/**/*.js', 'seeders/**/*.js', 'scripts/**/*.cjs', '.sequelizerc'],
    rules: { '@typescript-eslint/no-require-imports': 'off' },
  },
  { files: [`lib/science/**/*.${SCIENCE_FILES}`], rules: { 'no-restricted-imports': scienceImports(null) } },
  ...Array.from({ length: SCIENCE_DEPTHS }, (_, i) => ({
    files: [`lib/science/${'*/'.repeat(i)}*.${SCIENCE_FILES}`],
    rules: { 'no-restricted-imports': scienceImports(i + 1) },
  })),
  globalIgnores(['.next/**', '.next-*/**', '.var/**', 'node_modules/**', 'test-output/**', '.pgdata/**', '.pgrun/**', 'next-env.d.ts']),
]);
