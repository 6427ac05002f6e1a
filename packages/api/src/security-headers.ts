/**
 * The browser-side protections every answer carries, set by helmet: a Content-Security-Policy
 * that runs only the app's own script files, keeps the app out of other sites' frames and loads
 * images only from the app itself or data: URLs (no tracking pixels from a note's Markdown);
 * plus nosniff and a referrer policy that sends only the origin to other sites.
 */
import helmet from 'helmet';
import type { RequestHandler } from 'express';

export const contentSecurityPolicy = {
  'default-src': ["'self'"],
  'base-uri': ["'self'"],
  'connect-src': ["'self'"],
  'font-src': ["'self'"],
  'form-action': ["'self'"],
  'frame-ancestors': ["'none'"],
  'img-src': ["'self'", 'data:'],
  'object-src': ["'none'"],
  'script-src': ["'self'"],
  'script-src-attr': ["'none'"],
  // CodeMirror and Plotly set style attributes and insert <style> elements at run time, and
  // the server-rendered pages carry one small <style>; styles cannot run code, scripts can.
  'style-src': ["'self'", "'unsafe-inline'"],
  // The solver runs in a module worker loaded from the app's own files.
  'worker-src': ["'self'"],
};

export function securityHeaders(): RequestHandler {
  return helmet({
    // Spelled out whole, so what the app allows is read here and not in helmet's defaults.
    contentSecurityPolicy: { useDefaults: false, directives: contentSecurityPolicy },
    referrerPolicy: { policy: 'strict-origin-when-cross-origin' },
    // The same as frame-ancestors 'none', for browsers that read only the older header.
    frameguard: { action: 'deny' },
    // HTTPS only, once a browser has reached the app over HTTPS (ignored over plain HTTP); the
    // app's host alone, as other hosts under its domain are not the app's to decide for.
    strictTransportSecurity: { maxAge: 365 * 24 * 3600, includeSubDomains: false },
  });
}
