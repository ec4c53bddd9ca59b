import type { RequestHandler } from 'express';

/**
 * Headers of every API answer (JSON, or a zip download): never cached, never sniffed as
 * another type, never framed, no referrer; HSTS behind TLS. The set the OWASP REST Security
 * Cheat Sheet recommends for APIs (from memory). The web app's pages get helmet's fuller
 * set with a content security policy for the exported build (server/app.ts).
 */
export function apiSecurityHeaders(https: boolean): RequestHandler {
  const fixed: [string, string][] = [
    ['Cache-Control', 'no-store'],
    ['X-Content-Type-Options', 'nosniff'],
    ['Content-Security-Policy', "default-src 'none'; frame-ancestors 'none'"],
    ['X-Frame-Options', 'DENY'],
    ['Referrer-Policy', 'no-referrer'],
    ['Cross-Origin-Resource-Policy', 'same-origin'],
  ];
  if (https) fixed.push(['Strict-Transport-Security', 'max-age=31536000; includeSubDomains']);
  return (_req, res, next) => {
    for (const [name, value] of fixed) res.setHeader(name, value);
    next();
  };
}
