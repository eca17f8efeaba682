/**
 * The one shape every API error takes, so the client can show `message` and put
 * `fields` next to the matching inputs. Internals never appear here.
 */
export interface ApiErrorBody {
  error: {
    /** Stable machine-readable id, e.g. `validation_failed`. */
    code: string;
    /** A sentence a person can act on. */
    message: string;
    /** Per-field messages for forms, keyed by the field path (`address.city`). */
    fields?: Record<string, string>;
    /** Structured detail for some errors, e.g. a refused plan's `violations`. */
    [detail: string]: unknown;
  };
}

export const ERROR_CODES = [
  'validation_failed',
  'malformed_json',
  'payload_too_large',
  'unsupported_media_type',
  'not_signed_in',
  'forbidden',
  'not_found',
  'conflict',
  'csrf_failed',
  'rate_limited',
  'sign_in_failed',
  'account_pending',
  'account_disabled',
  'internal_error',
] as const;
export type ErrorCode = (typeof ERROR_CODES)[number] | (string & {});

/** Socket acknowledgements: always one of these two shapes. */
export type Ack<T> = { status: 'OK'; data: T } | { status: 'ERROR'; errors: ApiErrorBody['error'] };
