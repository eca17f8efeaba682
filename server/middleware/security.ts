import helmet from 'helmet';
import { rateLimit } from 'express-rate-limit';
import { csrfSync } from 'csrf-sync';
import type { RequestHandler } from 'express';
import type { ApiErrorBody } from '@shared/http';
import type { Config } from '../config';

/**
 * Where Stripe.js loads from and talks to, per Stripe's published CSP guidance
 * (docs.stripe.com/security/guide#content-security-policy): its script, its card field's frames,
 * its API for tokens, and the card brand icons.
 */
const STRIPE_JS_SOURCES = {
  script: ['https://js.stripe.com', 'https://*.js.stripe.com'],
  frame: ['https://js.stripe.com', 'https://*.js.stripe.com', 'https://hooks.stripe.com'],
  connect: ['https://api.stripe.com'],
  img: ['https://*.stripe.com'],
};

/**
 * Security headers. The CSP allows only our own origin: the built app loads nothing from
 * anywhere else (a browser test proves it). The one exception is Stripe.js, and only when a
 * publishable key is set, because Stripe requires its card field to load from its own origin.
 * Element Plus sets inline styles, hence 'unsafe-inline' for styles only.
 */
export function securityHeaders(config: Config): RequestHandler {
  const production = config.NODE_ENV === 'production';
  const stripe = config.STRIPE_PUBLISHABLE_KEY ? STRIPE_JS_SOURCES : { script: [], frame: [], connect: [], img: [] };
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        defaultSrc: ["'self'"],
        scriptSrc: ["'self'", ...stripe.script],
        styleSrc: ["'self'", "'unsafe-inline'"],
        imgSrc: ["'self'", 'data:', 'blob:', ...stripe.img],
        mediaSrc: ["'self'", 'blob:'],
        fontSrc: ["'self'", 'data:'],
        connectSrc: ["'self'", ...stripe.connect],
        frameSrc: stripe.frame.length > 0 ? stripe.frame : ["'self'"],
        objectSrc: ["'none'"],
        frameAncestors: ["'none'"],
        baseUri: ["'self'"],
        formAction: ["'self'"],
        ...(production ? { upgradeInsecureRequests: [] } : {}),
      },
    },
    strictTransportSecurity: production,
  });
}

/** Brute-force guard for sign-in and registration, per client address. */
export function authRateLimit(config: Config): RequestHandler {
  return rateLimit({
    windowMs: config.AUTH_RATE_WINDOW_SECONDS * 1000,
    limit: config.AUTH_RATE_LIMIT,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, res) => {
      const body: ApiErrorBody = { error: { code: 'rate_limited', message: 'Too many attempts. Please wait a few minutes and try again.' } };
      res.status(429).json(body);
    },
  });
}

/**
 * Synchroniser-token CSRF protection: the token lives in the session and must come back in the
 * `X-CSRF-Token` header on every state-changing request. SameSite cookies are the second layer.
 */
export function createCsrf() {
  const { csrfSynchronisedProtection, generateToken } = csrfSync({
    getTokenFromRequest: (req) => {
      const header = req.headers['x-csrf-token'];
      return typeof header === 'string' ? header : undefined;
    },
  });
  return { protect: csrfSynchronisedProtection, generateToken };
}
