import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { badRequest } from '../errors';

/** `field.path: message` for each zod issue, so forms can show errors next to inputs. */
export function fieldErrors(error: z.ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_';
    fields[key] ??= issue.message;
  }
  return fields;
}

function summarise(fields: Record<string, string>): string {
  const messages = Object.values(fields);
  return messages.length === 1 ? messages[0]! : `Please correct ${messages.length} fields: ${messages.join(' ')}`;
}

/** Parse anything (query strings, socket payloads) with a schema, or throw a 400 with per-field messages. */
export function parseOrThrow<S extends z.ZodType>(schema: S, data: unknown): z.output<S> {
  const parsed = schema.safeParse(data);
  if (!parsed.success) {
    const fields = fieldErrors(parsed.error);
    throw badRequest(summarise(fields), fields);
  }
  return parsed.data;
}

/** Parse and replace req.body with the schema's output, or answer 400 with per-field messages. */
export function validateBody<S extends z.ZodType>(schema: S): RequestHandler {
  return (req, _res, next) => {
    const body: unknown = req.body ?? {};
    const parsed = schema.safeParse(body);
    if (!parsed.success) {
      const fields = fieldErrors(parsed.error);
      throw badRequest(summarise(fields), fields);
    }
    req.body = parsed.data;
    next();
  };
}

/** Parse route params (numeric ids and so on); a bad id is a 404, not a 400, so ids cannot be probed. */
export function parseId(raw: string | undefined): number | null {
  if (!raw || !/^[1-9][0-9]{0,9}$/.test(raw)) return null;
  const id = Number(raw);
  return id <= 4_294_967_295 ? id : null;
}
