// ESLint flat config: typescript-eslint, react-hooks, and the import boundaries of
// docs/architecture (shared ← server, shared ← src; src and server never meet).
import js from '@eslint/js';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import tseslint from 'typescript-eslint';

const noFrameworks = [
  { group: ['react', 'react-*', 'react/*', '@tanstack/*'], message: 'shared/ is pure TypeScript: no React.' },
  { group: ['express', 'express-*', 'typeorm', 'pg', 'passport*', 'multer', 'pdfkit', 'bwip-js', 'nodemailer'], message: 'shared/ is pure TypeScript: no server libraries.' },
  { group: ['node:*', 'fs', 'path', 'crypto', 'child_process'], message: 'shared/ is pure TypeScript: no Node built-ins.' },
  { group: ['**/src/**', '**/server/**', '../src/*', '../server/*'], message: 'shared/ imports nothing from src/ or server/.' },
];

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', '.data/**', '.scratch/**', 'coverage/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
    },
  },
  {
    files: ['shared/**/*.ts'],
    rules: { 'no-restricted-imports': ['error', { patterns: noFrameworks }] },
  },
  {
    files: ['src/**/*.{ts,tsx}', 'tests/client/**/*.{ts,tsx}'],
    languageOptions: { globals: { ...globals.browser } },
    plugins: { 'react-hooks': reactHooks },
    rules: {
      ...reactHooks.configs.recommended.rules,
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['**/server/**'], message: 'The client never imports the server; share types through shared/api.' },
            { group: ['typeorm', 'class-validator', 'class-transformer', 'reflect-metadata', 'express'], message: 'Decorators and server libraries stay out of the browser bundle.' },
          ],
        },
      ],
    },
  },
  {
    // Client features do not import each other; a route page composes them.
    files: ['src/features/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['**/server/**'], message: 'The client never imports the server.' },
            { regex: '^\\.\\./\\.\\./(?!\\.\\.)[^/]+/', message: 'Features do not import each other; compose them in src/app/routes.' },
            { group: ['**/app/**'], message: 'Features do not import the app layer.' },
          ],
        },
      ],
    },
  },
  {
    files: ['server/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        { patterns: [{ group: ['**/src/**', 'react', 'react-dom', '@tanstack/*'], message: 'The server never imports the client.' }] },
      ],
    },
  },
);
