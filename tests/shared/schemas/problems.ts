import { expect } from 'vitest';
import type { ZodType } from 'zod';

/**
 * The messages a schema gives for `input`, keyed by field path (`setup.saddleHeight`, '' for the
 * whole value), as the API's `fields` would show them. Only the first message per path is kept.
 * Fails the test when the input is accepted.
 */
export function problems(schema: ZodType, input: unknown): Record<string, string> {
  const result = schema.safeParse(input);
  expect(result.success, `expected ${JSON.stringify(input)} to be refused`).toBe(false);
  const byPath: Record<string, string> = {};
  for (const issue of result.error?.issues ?? []) {
    const path = issue.path.map(String).join('.');
    byPath[path] ??= issue.message;
  }
  return byPath;
}

/** Every message a schema gives for `input`, in order (several per path included). */
export function messages(schema: ZodType, input: unknown): string[] {
  const result = schema.safeParse(input);
  expect(result.success, `expected ${JSON.stringify(input)} to be refused`).toBe(false);
  return (result.error?.issues ?? []).map((issue) => issue.message);
}

/** Today as YYYY-MM-DD in UTC, the way the schemas compare dates. */
export function todayUtc(offsetDays = 0): string {
  return new Date(Date.now() + offsetDays * 86_400_000).toISOString().slice(0, 10);
}
