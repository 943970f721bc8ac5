import { defineConfig, globalIgnores } from 'eslint/config';
import nextVitals from 'eslint-config-next/core-web-vitals';
import nextTs from 'eslint-config-next/typescript';
import prettier from 'eslint-config-prettier/flat';

// The layering, kept by the linter (DEVELOPERS.md, Boundaries). Paths are resolved, so an alias
// (`@/models`) and a relative path (`../../models`) are caught alike. Import cycles, type imports
// included, are found by scripts/check-boundaries.ts and tests/unit/boundaries.test.ts.
const SQL_PACKAGES = [
  { name: 'sequelize', message: 'SQL and models live in lib/ services and their queries.ts.' },
  { name: 'pg', message: 'SQL and models live in lib/ services and their queries.ts.' },
];

/** lib/science is pure: itself and the listed libraries only. */
const scienceRules = {
  'no-restricted-imports': [
    'error',
    {
      patterns: [
        {
          regex: '^(?!\\.\\.?/|simple-statistics$|jstat$|zod$)',
          message: 'lib/science imports only itself and simple-statistics, jstat or zod.',
        },
      ],
    },
  ],
  'import/no-restricted-paths': [
    'error',
    {
      zones: [
        {
          target: './lib/science',
          from: './',
          except: ['./lib/science', './node_modules'],
          message: 'lib/science imports nothing of the app.',
        },
      ],
    },
  ],
};

/** Components render; data comes through services and props, never models, SQL or app code. */
const componentRules = {
  'no-restricted-imports': ['error', { paths: SQL_PACKAGES }],
  'import/no-restricted-paths': [
    'error',
    {
      zones: [
        { target: './components', from: './models', message: 'Components import no models.' },
        { target: './components', from: './lib/db.ts', message: 'Components do not reach the database.' },
        { target: './components', from: './lib/**/queries.ts', message: 'Components run no SQL.' },
        {
          target: './components',
          from: './app',
          message: 'Components import no app code (pass actions as props).',
        },
      ],
    },
  ],
};

/** Pages, actions and route handlers call services: no SQL, no models. */
const appRules = {
  'no-restricted-imports': ['error', { paths: SQL_PACKAGES }],
  'import/no-restricted-paths': [
    'error',
    {
      zones: [
        { target: './app', from: './models', message: 'app/ calls services, never models.' },
        { target: './app', from: './lib/db.ts', message: 'app/ calls services, never the database.' },
        { target: './app', from: './lib/**/queries.ts', message: 'app/ calls services, never SQL.' },
      ],
    },
  ],
};

export default defineConfig([
  ...nextVitals,
  ...nextTs,
  prettier,
  {
    files: ['**/*.{js,jsx,mjs,ts,tsx,mts,cts}'],
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
    },
  },
  { files: ['lib/science/**'], rules: scienceRules },
  { files: ['components/**'], rules: componentRules },
  { files: ['app/**'], rules: appRules },
  {
    // sequelize-cli files are CommonJS by the CLI's rule.
    files: ['migrations/**/*.js', 'seeders/**/*.js', 'scripts/**/*.cjs', '.sequelizerc'],
    rules: { '@typescript-eslint/no-require-imports': 'off' },
  },
  globalIgnores([
    '.next/**',
    '.next-*/**',
    '.var/**',
    'node_modules/**',
    'test-output/**',
    '.pgdata/**',
    '.pgrun/**',
    'next-env.d.ts',
  ]),
]);
