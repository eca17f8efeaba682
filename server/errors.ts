import type { ApiErrorBody, ErrorCode } from '@shared/http';

/**
 * An error the API is allowed to show to its caller. Anything else that reaches the
 * error handler is logged and answered with a generic 500.
 */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: ErrorCode,
    message: string,
    readonly fields?: Record<string, string>,
    /** Extra structured detail a client can act on, e.g. the plan's `violations`. */
    readonly extra?: Record<string, unknown>,
  ) {
    super(message);
    this.name = 'AppError';
  }

  toBody(): ApiErrorBody {
    return { error: { code: this.code, message: this.message, ...(this.fields ? { fields: this.fields } : {}), ...this.extra } };
  }
}

export const badRequest = (message: string, fields?: Record<string, string>) => new AppError(400, 'validation_failed', message, fields);
export const notSignedIn = () => new AppError(401, 'not_signed_in', 'Please sign in to continue.');
export const forbidden = (message = 'Your account cannot do that.') => new AppError(403, 'forbidden', message);
/** Also used when something exists but the caller may not know that. */
export const notFound = (what = 'That page') => new AppError(404, 'not_found', `${what} was not found.`);
export const conflict = (message: string) => new AppError(409, 'conflict', message);
export const signInFailed = () => new AppError(401, 'sign_in_failed', 'That e-mail and password do not match an account.');
export const accountPending = () =>
  new AppError(403, 'account_pending', 'Your account is waiting for approval by the clinic. We will e-mail you when it is ready.');
export const accountDisabled = () => new AppError(403, 'account_disabled', 'This account has been switched off. Contact the clinic if you think this is a mistake.');
