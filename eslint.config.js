import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import globals from 'globals';
import reactHooks from 'eslint-plugin-react-hooks';
import { importX } from 'eslint-plugin-import-x';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';

const FEATURES = ['auth', 'bench', 'drafting', 'debrief', 'shop'];
const SERVER_PACKAGES = ['sequelize', 'express', 'pg', 'umzug', 'passport', 'nodemailer', 'multer'];

// Imports flow one way: shared <- server; shared <- src/lib, src/components <- src/features <- src/app.
// The zones are checked on the resolved file (tsconfig paths included), so no spelling of a path
// (relative, @shared alias, index file) gets around them.
const zone = (target, from, message) => ({ target, from, message });
const ZONES = [
  zone('./shared', ['./server', './src', './content'], 'shared/ imports nothing from server/, src/ or content/.'),
  zone('./server', './src', 'server/ never imports client code.'),
  zone('./src', ['./server', './content', './scripts'], 'The client never imports server code.'),
  zone(['./src/lib', './src/components'], ['./src/features', './src/app'], 'src/lib and src/components sit below the features.'),
  zone('./src/features', './src/app', 'Features do not import from src/app.'),
  ...FEATURES.map((feature) => zone(`./src/features/${feature}`, FEATURES.filter((f) => f !== feature).map((f) => `./src/features/${f}`),
    'A feature does not import another feature; move what both need down to src/lib or src/components.')),
];

export default tseslint.config(
  { ignores: ['dist/**', 'dist-server/**', 'node_modules/**', '.data/**', '.tmp/**', 'test-results/**', 'playwright-report/**', 'dev-dist/**',
    // violations on purpose: tests/lint/boundaries.test.ts lints them and expects each refused
    'tests/lint/fixtures/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'no-eval': 'error',
      'no-new-func': 'error',
      'no-implied-eval': 'error',
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: {
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'warn',
    },
  },
  {
    files: ['**/*.{ts,tsx,js,mjs}'],
    plugins: { 'import-x': importX },
    settings: {
      // How import-x reads the modules it follows (for no-cycle): TypeScript's parser for .ts/.tsx.
      ...Object.fromEntries(Object.entries(importX.flatConfigs.typescript.settings).filter(([k]) => k !== 'import-x/resolver')),
      'import-x/resolver-next': [createTypeScriptImportResolver({ project: 'tsconfig.json' })],
    },
    rules: {
      'import-x/no-restricted-paths': ['error', { zones: ZONES }],
      // A cycle makes load order matter and hides which module is the lower one.
      'import-x/no-cycle': ['error', { ignoreExternal: true }],
    },
  },
  {
    files: ['shared/**/*.ts'],
    rules: {
      'import-x/no-nodejs-modules': 'error',
      'no-restricted-imports': ['error', {
        patterns: [
          { group: ['react', 'react-dom', 'react/*', '@xyflow/*', ...SERVER_PACKAGES], message: 'shared/ is pure TypeScript: no React, Express, Sequelize, DOM or Node APIs.' },
        ],
      }],
      'no-restricted-globals': ['error', 'process', 'window', 'document', 'localStorage', 'navigator', 'Buffer', 'require', '__dirname', 'indexedDB'],
    },
  },
  {
    files: ['server/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { paths: ['react', 'react-dom'], patterns: [{ group: ['react/*', '@xyflow/*'], message: 'server/ never imports client code.' }] }],
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    rules: {
      'import-x/no-nodejs-modules': 'error',
      'no-restricted-imports': ['error', { patterns: [{ group: SERVER_PACKAGES, message: 'The client never imports server code.' }] }],
    },
  },
);