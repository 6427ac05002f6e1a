import { mkdtempSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { useTestServer } from '../test/use-test-server.js';

/** The policy's directives by name, e.g. `{ 'frame-ancestors': ["'none'"] }`. */
function directives(header: string | null): Record<string, string[]> {
  expect(header).toBeTruthy();
  return Object.fromEntries(
    header!
      .split(';')
      .map((part) => part.trim().split(/\s+/))
      .filter(([name]) => name)
      .map(([name, ...values]) => [name!, values]),
  );
}

describe('security headers', () => {
  const web = mkdtempSync(path.join(os.tmpdir(), 'rolloff-web-'));
  writeFileSync(path.join(web, 'index.html'), '<!doctype html><title>Rolloff</title><div id="root"></div>');
  const server = useTestServer({ webDist: web });

  it('keep the web app out of other sites’ frames and run only its own script files', async () => {
    const response = await fetch(`${server.url}/notebooks/42`);
    expect(response.status).toBe(200);
    const csp = directives(response.headers.get('content-security-policy'));
    expect(csp['frame-ancestors']).toEqual(["'none'"]);
    expect(csp['script-src']).toEqual(["'self'"]);
    expect(csp['script-src-attr']).toEqual(["'none'"]);
    expect(csp['img-src']).toEqual(["'self'", 'data:']);
    expect(csp['object-src']).toEqual(["'none'"]);
    expect(response.headers.get('x-frame-options')).toBe('DENY');
    expect(response.headers.get('x-content-type-options')).toBe('nosniff');
    expect(response.headers.get('referrer-policy')).toBe('strict-origin-when-cross-origin');
    expect(response.headers.get('strict-transport-security')).toBe('max-age=31536000');
  });

  it('come with the API’s answers and the sign-in pages too', async () => {
    for (const url of [`${server.url}/api/health`, `${server.url}/api/no-such-thing`, `${server.url}/auth/github/callback?error=access_denied`]) {
      const response = await fetch(url, { redirect: 'manual' });
      expect(directives(response.headers.get('content-security-policy'))['frame-ancestors'], url).toEqual(["'none'"]);
      expect(response.headers.get('x-content-type-options'), url).toBe('nosniff');
    }
  });

  it('leave no inline script in the sign-in pages', async () => {
    const response = await fetch(`${server.url}/auth/github/callback?error=access_denied`, { redirect: 'manual' });
    expect(response.headers.get('content-type')).toContain('text/html');
    expect(await response.text()).not.toMatch(/<script|\son\w+=/i);
  });
});
