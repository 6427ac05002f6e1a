import { NotebookSchema } from '@rolloff/api/contract';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import { ApiError, apiRequest, onUnauthenticated } from './api-client';

function answer(status: number, body: unknown) {
  const fetchMock = vi.fn(async (_url: string, _init?: RequestInit) => new Response(body === null ? null : JSON.stringify(body), { status }));
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

describe('the API client', () => {
  afterEach(() => vi.unstubAllGlobals());

  it('sends the CSRF cookie’s value in the header of a state-changing request, and not on a read', async () => {
    document.cookie = 'rolloff_csrf=abc123';
    const fetchMock = answer(200, { ok: true });
    await apiRequest('/api/notebooks', z.object({ ok: z.boolean() }), { method: 'POST', body: { title: 'x' } });
    expect((fetchMock.mock.calls[0][1]?.headers as Record<string, string>)['x-csrf-token']).toBe('abc123');
    await apiRequest('/api/notebooks', z.object({ ok: z.boolean() }));
    expect((fetchMock.mock.calls[1][1]?.headers as Record<string, string>)['x-csrf-token']).toBeUndefined();
  });

  it('turns the API’s error shape into an ApiError with its id and message', async () => {
    answer(400, {
      error: 'validation',
      message: 'title: A title cannot be empty.',
      details: { issues: [{ path: 'title', message: 'A title cannot be empty.' }] },
    });
    const error = await apiRequest('/api/notebooks', z.unknown(), { method: 'POST', body: {} }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({ status: 400, id: 'validation', message: 'title: A title cannot be empty.' });
  });

  it('reports a lost session in one place, unless the 401 was expected', async () => {
    const listener = vi.fn();
    const stop = onUnauthenticated(listener);
    answer(401, { error: 'unauthenticated', message: 'Sign in first.' });
    await apiRequest('/api/notebooks', z.unknown()).catch(() => undefined);
    expect(listener).toHaveBeenCalledTimes(1);
    await apiRequest('/api/me', z.unknown(), { quietUnauthenticated: true }).catch(() => undefined);
    expect(listener).toHaveBeenCalledTimes(1);
    stop();
  });

  it('says the server cannot be reached when the request fails on the way', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => Promise.reject(new TypeError('Failed to fetch'))),
    );
    const error = await apiRequest('/api/notebooks', z.unknown()).catch((e: unknown) => e);
    expect(error).toMatchObject({ status: 0, unreachable: true });
  });

  it('refuses an answer that does not match the contract', async () => {
    answer(200, { id: 'x' });
    const error = await apiRequest('/api/notebooks/x', NotebookSchema).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect((error as ApiError).message).toContain('expected shape');
  });
});
