import { describe, expect, it } from 'vitest';
import { ESLint } from 'eslint';

/** The lint rule that keeps shared/ runnable unchanged in the browser and in Node. */
// ESLint's first start-up is slow on a busy 2-core machine; the rule itself is what is tested.
describe('the shared/ purity rule', { timeout: 30_000 }, () => {
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
  ])('flags %s', async (code, rule) => {
    expect(await lint(`${code}\nexport {};\n`)).toContain(rule);
  });

  it('allows pure imports such as zod and sibling files', async () => {
    expect(await lint("import { z } from 'zod';\nimport { ROLES } from './auth/roles';\nexport const s = [z, ROLES];\n")).toEqual([]);
  });
});
