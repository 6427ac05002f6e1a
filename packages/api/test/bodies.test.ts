import { beforeAll, describe, expect, it } from 'vitest';
import type { Client } from './client.js';
import { signedIn } from './client.js';
import { buildNotebook } from './factories.js';
import { useTestServer } from './use-test-server.js';

interface ErrorReply {
  error: string;
  message: string;
  details?: { issues: { path: string; message: string }[] };
}

describe('bodies the API cannot use', () => {
  const server = useTestServer();
  let client: Client;
  let notebook: Awaited<ReturnType<typeof buildNotebook>>;
  beforeAll(async () => {
    notebook = await buildNotebook();
    client = await signedIn(server.url, notebook.ownerUser.login);
  });

  it('refuses control characters in titles and labels, naming the field', async () => {
    const cellId = notebook.cells[0]!.id;
    for (const bad of ['Tone\u0000', 'Tone\u001b[31m', 'Tone\r\nnetwork', 'Tone\nnetwork', 'Tone\u0085']) {
      const cases = [
        { path: 'title', reply: await client.post<ErrorReply>('/api/notebooks', { title: bad }) },
        { path: 'title', reply: await client.patch<ErrorReply>(`/api/notebooks/${notebook.id}`, { title: bad }) },
        { path: 'title', reply: await client.patch<ErrorReply>(`/api/notebooks/${notebook.id}/cells/${cellId}`, { title: bad }) },
        { path: 'label', reply: await client.post<ErrorReply>(`/api/notebooks/${notebook.id}/versions`, { label: bad }) },
        { path: 'trace', reply: await client.post<ErrorReply>(`/api/notebooks/${notebook.id}/pins`, { cellId, trace: bad, frequency: 1000, body: 'x' }) },
      ];
      for (const { path, reply } of cases) {
        expect(reply.status, JSON.stringify(bad)).toBe(400);
        expect(reply.body.details!.issues).toEqual([{ path, message: expect.stringMatching(/one line of plain text/) }]);
      }
    }
  });

  it('refuses half of a character (a lone surrogate) anywhere in a body instead of storing something else', async () => {
    const title = await client.request<ErrorReply>('POST', '/api/notebooks', undefined, { raw: '{"title": "Tone \\ud800"}' });
    expect(title.status).toBe(400);
    expect(title.body.details!.issues).toEqual([{ path: 'title', message: expect.stringMatching(/lone UTF-16 surrogate/) }]);
    const cellId = notebook.cells[0]!.id;
    const text = await client.request<ErrorReply>('PUT', `/api/notebooks/${notebook.id}/cells/${cellId}`, undefined, {
      raw: '{"text": "R1 [a b] 1k \\udc00", "baseRevision": 1}',
    });
    expect(text.status).toBe(400);
    expect(text.body.details!.issues[0]!.path).toBe('text');
    // A whole character outside the first plane (a pair of surrogates) is fine.
    const pair = await client.request<ErrorReply>('POST', '/api/notebooks', undefined, { raw: '{"title": "Tone \\ud83c\\udfb5"}' });
    expect(pair.status).toBe(201);
  });

  it('answers malformed JSON with 400, saying so', async () => {
    const reply = await client.post<ErrorReply>('/api/notebooks', undefined, { raw: '{"title": "Tone network",' });
    expect(reply.status).toBe(400);
    expect(reply.body).toEqual({ error: 'validation', message: 'The request body is not valid JSON.' });
  });

  it('names the field of a value of the wrong type', async () => {
    const title = await client.post<ErrorReply>('/api/notebooks', { title: 42 });
    expect(title.status).toBe(400);
    expect(title.body.message).toMatch(/^title: .*expected string, received number/);
    expect(title.body.details!.issues).toEqual([{ path: 'title', message: expect.stringMatching(/expected string/) }]);

    const cellId = notebook.cells[0]!.id;
    const revision = await client.put<ErrorReply>(`/api/notebooks/${notebook.id}/cells/${cellId}`, { text: 'x', baseRevision: '1' });
    expect(revision.status).toBe(400);
    expect(revision.body.message).toMatch(/^baseRevision: /);

    const nested = await client.post<ErrorReply>('/api/notebooks', {
      title: 'x',
      cells: [
        { kind: 'note', text: '' },
        { kind: 'diagram', text: '' },
      ],
    });
    expect(nested.status).toBe(400);
    expect(nested.body.details!.issues.map((i) => i.path)).toEqual(['cells.1.kind']);
    expect(nested.body.message).toMatch(/"circuit"\|"note"/);

    const extra = await client.post<ErrorReply>(`/api/notebooks/${notebook.id}/cells`, { kind: 'note', text: '', colour: 'red' });
    expect(extra.status).toBe(400);
    expect(extra.body.message).toMatch(/colour/);

    const missing = await client.post<ErrorReply>(`/api/notebooks/${notebook.id}/cells`, { text: 'no kind' });
    expect(missing.status).toBe(400);
    expect(missing.body.message).toMatch(/^kind: /);
  });

  it('wants a JSON object: not an array, a bare value, or another content type', async () => {
    for (const raw of ['[]', '"text"', '12', 'null']) {
      const reply = await client.post<ErrorReply>('/api/notebooks', undefined, { raw });
      expect(reply.status, raw).toBe(400);
      expect(reply.body.error).toBe('validation');
    }
    const text = await client.post<ErrorReply>('/api/notebooks', undefined, {
      raw: 'title=x',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
    });
    expect(text.status).toBe(400);
    expect(text.body.message).toMatch(/must be a JSON object/);
  });

  it('answers a body over the size limit with 413', async () => {
    const reply = await client.post<ErrorReply>('/api/notebooks', undefined, { raw: JSON.stringify({ title: 'x', pad: 'y'.repeat(1_100_000) }) });
    expect(reply.status).toBe(413);
    expect(reply.body).toEqual({ error: 'too_large', message: 'The request body is too large.' });
  });

  it('never answers 500 to odd input', async () => {
    const odd = [
      ['POST', '/api/notebooks', '{"title": {"$gt": ""}}'],
      ['POST', '/api/notebooks', '{"title": "x", "cells": {"0": {"kind": "note"}}}'],
      ['POST', `/api/notebooks/${notebook.id}/cells`, '{"kind": "note", "position": -1}'],
      ['POST', `/api/notebooks/${notebook.id}/cells`, '{"kind": "note", "position": 1.5}'],
      ['POST', `/api/notebooks/${notebook.id}/cells/abc/move`, '{"position": 0}'],
      ['PUT', `/api/notebooks/${notebook.id}/cells/99999999999`, '{"text": "x", "baseRevision": 1}'],
      ['PUT', `/api/notebooks/${notebook.id}/members/0`, '{"role": "viewer"}'],
      ['POST', `/api/notebooks/${notebook.id}/versions`, '{"label": null}'],
      ['POST', `/api/notebooks/${notebook.id}/forks`, '{"version": "latest"}'],
      ['PATCH', `/api/notebooks/${notebook.id}`, '{"visibility": "public"}'],
      ['PATCH', '/api/admin/users/1', '{"disabled": "yes"}'],
      ['POST', `/api/notebooks/${notebook.id}/pins`, '{"cellId": "1", "trace": "out", "frequency": 1000, "body": "x"}'],
      ['POST', `/api/notebooks/${notebook.id}/pins`, '{"cellId": 1, "trace": ["out"], "frequency": null, "body": {"text": "x"}}'],
      ['POST', `/api/notebooks/${notebook.id}/pins`, '{"cellId": 1e30, "trace": "out", "frequency": 1000, "body": "x"}'],
      ['POST', `/api/notebooks/${notebook.id}/pins/1.5/comments`, '{"body": "x"}'],
      ['POST', `/api/notebooks/${notebook.id}/pins/99999999999/resolve`, '{}'],
      ['GET', `/api/notebooks/${notebook.id}/pins?cellId=-1`, ''],
      ['POST', `/api/notebooks/${notebook.id}/reviews`, '{"reviewerIds": "everyone"}'],
      ['POST', `/api/notebooks/${notebook.id}/reviews`, '{"reviewerIds": [1e30], "versionNumber": -1}'],
      ['POST', `/api/notebooks/${notebook.id}/reviews/abc/decision`, '{"state": "signed_off"}'],
      ['POST', `/api/notebooks/${notebook.id}/reviews/1/decision`, '{"state": null, "summary": 5}'],
      ['GET', `/api/notebooks/${notebook.id}/activity?limit=1000&cursor[]=x`, ''],
      ['PATCH', '/api/me/settings', '{"mail": {"pinReplies": 1}}'],
      ['PATCH', '/api/me/settings', '{"mail": null}'],
    ] as const;
    for (const [method, path, raw] of odd) {
      const reply = await client.request<ErrorReply>(method, path, undefined, raw ? { raw } : {});
      expect(reply.status, `${method} ${path} ${raw}`).toBeGreaterThanOrEqual(400);
      expect(reply.status, `${method} ${path} ${raw}`).toBeLessThan(500);
      expect(typeof reply.body.message).toBe('string');
    }
    const query = await client.get<ErrorReply>('/api/notebooks?limit=abc&scope[]=mine');
    expect(query.status).toBe(400);
  });
});
