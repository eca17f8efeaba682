import type { ErrorRequestHandler, RequestHandler } from 'express';
import type { ApiErrorBody } from '@shared/http';
import { AppError, notFound } from '../errors';
import type { Logger } from '../logger';

/** Errors raised by body-parser, multer and friends carry a status and a type we translate. */
interface HttpLibraryError {
  status?: number;
  statusCode?: number;
  type?: string;
  code?: string;
  expose?: boolean;
}

function translateLibraryError(error: HttpLibraryError): AppError | null {
  const status = error.status ?? error.statusCode;
  if (error.type === 'entity.parse.failed') return new AppError(400, 'malformed_json', 'The request body is not valid JSON.');
  if (error.type === 'entity.too.large') return new AppError(413, 'payload_too_large', 'The request is too large.');
  if (error.type === 'encoding.unsupported' || error.type === 'charset.unsupported') {
    return new AppError(415, 'unsupported_media_type', 'Send the request as UTF-8 JSON.');
  }
  if (error.code === 'EBADCSRFTOKEN' || (status === 403 && /csrf/i.test(String((error as Error).message)))) {
    return new AppError(403, 'csrf_failed', 'Your session has expired or the form is stale. Reload the page and try again.');
  }
  if (typeof status === 'number' && status >= 400 && status < 500 && error.expose) {
    return new AppError(status, 'bad_request', 'The request could not be read.');
  }
  return null;
}

export function createErrorHandler(logger: Logger): ErrorRequestHandler {
  return (error, req, res, _next) => {
    const known = error instanceof AppError ? error : translateLibraryError(error as HttpLibraryError);
    if (known) {
      res.status(known.status).json(known.toBody());
      return;
    }
    logger.error({ err: error, method: req.method, url: req.originalUrl }, 'unhandled error');
    if (res.headersSent) return;
    const body: ApiErrorBody = { error: { code: 'internal_error', message: 'Something went wrong on our side. Please try again.' } };
    res.status(500).json(body);
  };
}

/** Unknown API paths answer JSON 404 rather than the client's index.html. */
export const apiNotFound: RequestHandler = () => {
  throw notFound('That API route');
};
