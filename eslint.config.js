// @ts-check
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import pluginVue from 'eslint-plugin-vue';
import globals from 'globals';

/** Node built-ins, server and client code that shared/ must never reach. */
const FORBIDDEN_IN_SHARED = [
  { group: ['node:*'], message: 'shared/ is pure TypeScript: no Node built-ins.' },
  { group: ['@/*', '../src/*', '../../src/*', '**/src/*'], message: 'shared/ must not import client code.' },
  { group: ['@server/*', '../server/*', '../../server/*', '**/server/*'], message: 'shared/ must not import server code.' },
];

/** Exact module names (not patterns, which would also match our own files such as ./events). */
const FORBIDDEN_MODULES_IN_SHARED = [
  ...['fs', 'path', 'os', 'crypto', 'http', 'https', 'url', 'util', 'stream', 'events', 'child_process', 'buffer', 'net'].map((name) => ({
    name,
    message: 'shared/ is pure TypeScript: no Node built-ins.',
  })),
  ...['vue', 'vue-router', 'pinia', 'element-plus', 'express', 'sequelize', 'socket.io', 'socket.io-client', 'mariadb', 'multer', 'nodemailer', 'stripe'].map((name) => ({
    name,
    message: 'shared/ must not depend on a framework or server library.',
  })),
];

export default tseslint.config(
  { ignores: ['dist/**', 'coverage/**', 'node_modules/**', '.data/**', 'public/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  ...pluginVue.configs['flat/recommended'],
  {
    files: ['**/*.vue'],
    languageOptions: { parserOptions: { parser: tseslint.parser } },
  },
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser }, ecmaVersion: 2023, sourceType: 'module' },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'vue/multi-word-component-names': 'off',
      'vue/max-attributes-per-line': 'off',
      'vue/singleline-html-element-content-newline': 'off',
      'vue/html-self-closing': 'off',
      'vue/no-v-html': 'error',
    },
  },
  {
    files: ['shared/**/*.ts'],
    languageOptions: { globals: {} },
    rules: {
      'no-restricted-imports': ['error', { paths: FORBIDDEN_MODULES_IN_SHARED, patterns: FORBIDDEN_IN_SHARED }],
      // No DOM or Node globals either: shared code runs unchanged in both places.
      'no-restricted-globals': ['error', 'window', 'document', 'process', 'Buffer', 'require', '__dirname', 'localStorage', 'fetch'],
    },
  },
);
