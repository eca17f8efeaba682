// @ts-check
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import pluginVue from 'eslint-plugin-vue';
import globals from 'globals';
import { builtinModules } from 'node:module';

/** Node's built-in modules, e.g. fs, fs/promises, zlib, with or without the node: prefix. */
const NODE_BUILTINS = builtinModules.filter((name) => !name.startsWith('_'));
const escape = (name) => name.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&');

/** Server and client code, Node built-ins, and any package outside the allow-list. */
const FORBIDDEN_IN_SHARED = [
  { regex: `^(node:)?(${NODE_BUILTINS.map(escape).join('|')})(/.*)?$`, message: 'shared/ is pure TypeScript: no Node built-ins.' },
  { regex: '^node:', message: 'shared/ is pure TypeScript: no Node built-ins.' },
  { group: ['@/*', '../src/*', '../../src/*', '**/src/*'], message: 'shared/ must not import client code.' },
  { group: ['@server/*', '../server/*', '../../server/*', '**/server/*'], message: 'shared/ must not import server code.' },
  // The allow-list: zod, luxon, @shared/* and relative files. Any other package (sharp, pino, vue,
  // express...) would tie shared/ to one side or pull I/O into it.
  { regex: '^(?!(zod|luxon)(/|$)|@shared/|\\.{1,2}(/|$))', message: 'shared/ may import only zod, luxon, @shared/* and relative files.' },
];

/**
 * Globals shared/ must not touch: everything Node or the browser adds on top of the language
 * (window, document, process, Buffer, global, navigator, sessionStorage, fetch...), less a few
 * pure, side-effect-free helpers both sides have.
 */
const UNIVERSAL_PURE_GLOBALS = new Set(['URL', 'URLSearchParams', 'TextEncoder', 'TextDecoder', 'structuredClone', 'queueMicrotask', 'AbortController', 'AbortSignal', 'atob', 'btoa']);
const FORBIDDEN_GLOBALS_IN_SHARED = [...new Set([...Object.keys(globals.node), ...Object.keys(globals.browser), 'global', 'require', 'module', 'exports', '__dirname', '__filename'])]
  .filter((name) => !(name in globals.builtin) && !UNIVERSAL_PURE_GLOBALS.has(name))
  .sort();
const GLOBAL_OBJECTS = ['globalThis', 'global', 'window', 'self'];

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
    // Node and browser globals everywhere but shared/: a later block's `globals: {}` would not remove them.
    ignores: ['shared/**'],
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
  },
  {
    languageOptions: { ecmaVersion: 2023, sourceType: 'module' },
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
    languageOptions: { globals: { ...globals.builtin } },
    rules: {
      'no-restricted-imports': ['error', { patterns: FORBIDDEN_IN_SHARED }],
      // No DOM or Node globals either, bare or through globalThis: shared code runs unchanged in both places.
      'no-restricted-globals': ['error', ...FORBIDDEN_GLOBALS_IN_SHARED.map((name) => ({ name, message: 'shared/ runs in the browser and in Node unchanged: no environment globals.' }))],
      'no-restricted-properties': [
        'error',
        ...GLOBAL_OBJECTS.flatMap((object) => FORBIDDEN_GLOBALS_IN_SHARED.map((property) => ({ object, property, message: 'shared/ runs in the browser and in Node unchanged: no environment globals.' }))),
      ],
    },
  },
);
