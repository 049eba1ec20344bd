import helmet from 'helmet';
import type { RequestHandler } from 'express';

/**
 * helmet with a strict Content Security Policy that the built client passes: scripts,
 * styles, fonts and data only from Lagbook's own origin (fonts ship through npm, nothing
 * from a CDN); images also from data:/blob: (chart exports); no framing.
 * Sign-in starts from a link, so form-action can stay 'self'.
 */
export function securityHeaders({ secure }: { secure: boolean }): RequestHandler {
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        'default-src': ["'self'"],
        'script-src': ["'self'"],
        'style-src': ["'self'"],
        'img-src': ["'self'", 'data:', 'blob:'],
        'font-src': ["'self'"],
        'connect-src': ["'self'"],
        'object-src': ["'none'"],
        'base-uri': ["'self'"],
        'form-action': ["'self'"],
        'frame-ancestors': ["'none'"],
        ...(secure ? { 'upgrade-insecure-requests': [] } : {}),
      },
    },
    strictTransportSecurity: secure ? { maxAge: 15552000, includeSubDomains: true } : false,
    crossOriginEmbedderPolicy: false,
  });
}
