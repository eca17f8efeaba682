import { describe, expect, it } from 'vitest';
import { ESLint } from 'eslint';

/** The lint rule that keeps shared/ runnable unchanged in the browser and in Node. */
// ESLint's first start-up is slow on a busy 2-core machine (over 40 s at load 15 in a full run);
// the rule itself is what is tested.
describe('the shared/ purity rule', { timeout: 90_000 }, () => {
  const eslint = new ESLint();
  const lint = async (code: string) => (await eslint.lintText(code, { filePath: 'shared/probe.ts' }))[0]!.messages.map((m) => m.ruleId);

  it.each([
    ["import fs from 'fs';", 'no-restricted-imports'],
    ["import { join } from 'node:path';", 'no-restricted-imports'],
    ["import express from 'express';", 'no-restricted-imports'],
    ["import { ref } from 'vue';", 'no-restricted-imports'],
    ["import { createApp } from '../server/app';", 'no-restricted-imports'],
    ["import x from '@/stores/auth';", 'no-restricted-imports'],
    ['export const here = window.location.href;', 'no-restricted-globals'],
    ['export const env = process.env.X;', 'no-restricted-globals'],
    ["import { readFile } from 'fs/promises';", 'no-restricted-imports'],
    ["import { readFile } from 'node:fs/promises';", 'no-restricted-imports'],
    ["import zlib from 'zlib';", 'no-restricted-imports'],
    ["import { gzipSync } from 'node:zlib';", 'no-restricted-imports'],
    ["import sharp from 'sharp';", 'no-restricted-imports'],
    ["import pino from 'pino';", 'no-restricted-imports'],
    ["import { Op } from 'sequelize';", 'no-restricted-imports'],
    ["import { z } from 'zodiac';", 'no-restricted-imports'],
    ['export const lang = navigator.language;', 'no-restricted-globals'],
    ["export const saved = sessionStorage.getItem('x');", 'no-restricted-globals'],
    ['export const g = global;', 'no-restricted-globals'],
    ['export const env = globalThis.process.env;', 'no-restricted-properties'],
    ["export const env = globalThis['process'];", 'no-restricted-properties'],
    ['export const doc = globalThis.document;', 'no-restricted-properties'],
    ["export const fs = require('fs');", 'no-restricted-globals'],
  ])('flags %s', async (code, rule) => {
    expect(await lint(`${code}\nexport {};\n`)).toContain(rule);
  });

  it('allows the allow-listed imports (zod, luxon, @shared/*, relative files) and the language’s own globals', async () => {
    const code = [
      "import { z } from 'zod';",
      "import { DateTime } from 'luxon';",
      "import { FitInputError } from '@shared/fit/errors';",
      "import { ROLES } from './auth/roles';",
      "import { x } from '../fit/errors';",
      'export const s = [z, DateTime, FitInputError, ROLES, x, Math.PI, new Intl.NumberFormat(), structuredClone({}), globalThis.Math];',
    ].join('\n');
    expect(await lint(`${code}\n`)).toEqual([]);
  });

  it('does not give shared/ the Node and browser globals the rest of the project has', async () => {
    const config = await eslint.calculateConfigForFile('shared/probe.ts');
    expect(config.languageOptions.globals).not.toHaveProperty('window');
    expect(config.languageOptions.globals).not.toHaveProperty('process');
    expect((await eslint.calculateConfigForFile('server/probe.ts')).languageOptions.globals).toHaveProperty('process');
  });
});
