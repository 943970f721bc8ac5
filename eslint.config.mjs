import { defineConfig, globalIgnores } from 'eslint/config';
import nextVitals from 'eslint-config-next/core-web-vitals';
import nextTs from 'eslint-config-next/typescript';

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
  globalIgnores(['.next/**', '.next-*/**', '.var/**', 'node_modules/**', 'test-output/**', '.pgdata/**', '.pgrun/**', 'next-env.d.ts']),
]);
