import { z } from 'zod';

/** A tag opener such as `<script`, `</`, `<!--` or `<img`; "< 2 weeks" and "pain <5" stay allowed. */
const MARKUP = /<\s*[a-z!/?]/i;
/** Control characters other than line breaks and tabs would corrupt e-mails, exports and logs. */
const CONTROL = /(?![\n\r\t])\p{Cc}/u;

/**
 * Free text a rider types (injury history, goals, cleat notes). Plain text only: it is always
 * shown escaped, but markup is refused outright so nothing that looks like a script is ever stored.
 */
export function plainText(label: string, max: number) {
  return z
    .string({ error: `Enter the ${label} as text.` })
    .trim()
    .max(max, `The ${label} can be at most ${max} characters.`)
    .refine((value) => !MARKUP.test(value), `Please leave HTML tags such as <script> out of the ${label}.`)
    .refine((value) => !CONTROL.test(value), `The ${label} cannot contain control characters.`);
}

/** Objects refuse unknown fields by name, so a smuggled field gets a clear 400. */
export function strictShape<T extends z.core.$ZodLooseShape>(shape: T, what = 'the form') {
  return z.strictObject(shape, {
    error: (issue) => {
      if (issue.code === 'unrecognized_keys') return `Unexpected field: ${issue.keys.join(', ')}.`;
      if (issue.code === 'invalid_type') return `Send ${what} as a set of named fields.`;
      return undefined;
    },
  });
}

/** For a discriminated union on `unit`: a missing object and a missing unit get different messages. */
export function unitUnionError(what: string) {
  return (issue: { input?: unknown }) =>
    issue.input === null || typeof issue.input !== 'object' || Array.isArray(issue.input)
      ? `Send ${what} as a set of named fields.`
      : 'Choose mm or in as the unit.';
}

/** A positive database id sent in a body. */
export const idSchema = z.number({ error: 'Expected an id number.' }).int('Expected an id number.').positive('Expected an id number.').max(4_294_967_295, 'Expected an id number.');

/**
 * Guide texts come both as clauses ("from the centre of the bottom bracket…") and as whole
 * sentences; shown on their own, each must read as one sentence with exactly one closing stop.
 */
export function asSentence(text: string): string {
  const t = text.trim();
  if (t === '') return '';
  const capital = t.charAt(0).toUpperCase() + t.slice(1);
  return /[.!?]$/.test(capital) ? capital : `${capital}.`;
}
