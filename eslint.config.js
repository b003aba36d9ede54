import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import globals from 'globals';
import reactHooks from 'eslint-plugin-react-hooks';

const FEATURES = ['auth', 'bench', 'drafting', 'debrief', 'shop'];

// Imports flow one way: shared <- server; shared <- src/lib <- src/features <- src/app.
const featureRules = FEATURES.map((feature) => ({
  files: [`src/features/${feature}/**/*.{ts,tsx}`],
  rules: {
    'no-restricted-imports': ['error', {
      patterns: [
        { group: ['**/server/**', 'sequelize', 'express', 'pg'], message: 'The client never imports server code.' },
        { group: ['**/app/**'], message: 'Features do not import from src/app.' },
        ...FEATURES.filter((f) => f !== feature).map((other) => ({
          group: [`**/features/${other}/**`, `../${other}/**`, `../../${other}/**`],
          message: 'A feature does not import another feature; move what both need down to src/lib or src/components.',
        })),
      ],
    }],
  },
}));

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', '.data/**', '.tmp/**', 'test-results/**', 'playwright-report/**', 'dev-dist/**'] },
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
    files: ['shared/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', {
        patterns: [
          { group: ['react', 'react-dom', 'express', 'sequelize', 'pg', '@xyflow/*', 'node:*'], message: 'shared/ is pure TypeScript: no React, Express, Sequelize, DOM or Node APIs.' },
          { group: ['**/server/**', '**/src/**'], message: 'shared/ imports nothing from server/ or src/.' },
        ],
      }],
      'no-restricted-globals': ['error', 'process', 'window', 'document', 'localStorage'],
    },
  },
  {
    files: ['server/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', {
        patterns: [{ group: ['**/src/**', 'react', 'react-dom'], message: 'server/ never imports client code.' }],
      }],
    },
  },
  {
    files: ['src/lib/**/*.{ts,tsx}', 'src/components/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': ['error', {
        patterns: [
          { group: ['**/server/**', 'sequelize', 'express', 'pg'], message: 'The client never imports server code.' },
          { group: ['**/features/**', '**/app/**'], message: 'src/lib and src/components sit below the features.' },
        ],
      }],
    },
  },
  ...featureRules,
);
