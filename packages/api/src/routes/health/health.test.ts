import { mkdtempSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { HealthSchema } from '../../contract/health.js';
import { useTestServer } from '../../../test/use-test-server.js';

describe('GET /api/health', () => {
  const web = mkdtempSync(path.join(os.tmpdir(), 'rolloff-web-'));
  writeFileSync(path.join(web, 'index.html'), '<!doctype html><title>Rolloff</title><div id="root"></div>');
  const server = useTestServer({ webDist: web });

  it('answers ok after a real query to MariaDB', async () => {
    const response = await fetch(`${server.url}/api/health`);
    expect(response.status).toBe(200);
    const body = HealthSchema.parse(await response.json());
    expect(body).toMatchObject({ status: 'ok', db: 'up' });
    expect(body.version).toMatch(/^\d+\.\d+\.\d+/);
  });

  it('answers an unknown API route with a 404 in the error shape', async () => {
    const response = await fetch(`${server.url}/api/no-such-thing`);
    expect(response.status).toBe(404);
    expect(await response.json()).toMatchObject({ error: 'not_found' });
  });

  it('serves the web app for client-side routes', async () => {
    const response = await fetch(`${server.url}/notebooks/42`);
    expect(response.status).toBe(200);
    expect(await response.text()).toContain('<div id="root">');
  });
});
