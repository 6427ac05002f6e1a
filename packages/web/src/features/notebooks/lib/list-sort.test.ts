import { describe, expect, it } from 'vitest';
import { DEFAULT_SORT, nextSort, sortFromParams, withSort } from './list-sort';

describe('the notebooks table sort', () => {
  it('reads the address, falling back to the newest change first', () => {
    expect(sortFromParams(new URLSearchParams('sort=title&order=desc'))).toEqual({ sort: 'title', order: 'desc' });
    expect(sortFromParams(new URLSearchParams('sort=title'))).toEqual({ sort: 'title', order: 'asc' });
    expect(sortFromParams(new URLSearchParams('sort=created&order=sideways'))).toEqual({ sort: 'created', order: 'desc' });
    expect(sortFromParams(new URLSearchParams('sort=owner&order=asc'))).toEqual(DEFAULT_SORT);
    expect(sortFromParams(new URLSearchParams())).toEqual({ sort: 'changed', order: 'desc' });
  });

  it('turns the same column around and starts another in its first order', () => {
    expect(nextSort({ sort: 'changed', order: 'desc' }, 'changed')).toEqual({ sort: 'changed', order: 'asc' });
    expect(nextSort({ sort: 'title', order: 'asc' }, 'title')).toEqual({ sort: 'title', order: 'desc' });
    expect(nextSort({ sort: 'title', order: 'desc' }, 'created')).toEqual({ sort: 'created', order: 'desc' });
    expect(nextSort({ sort: 'created', order: 'asc' }, 'title')).toEqual({ sort: 'title', order: 'asc' });
  });

  it('writes the sort into the address, keeping the rest, and leaves the default out', () => {
    const params = new URLSearchParams('scope=mine&q=loop');
    expect(withSort(params, { sort: 'title', order: 'asc' }).toString()).toBe('scope=mine&q=loop&sort=title&order=asc');
    expect(withSort(new URLSearchParams('scope=mine&sort=title&order=asc'), DEFAULT_SORT).toString()).toBe('scope=mine');
    expect(params.toString()).toBe('scope=mine&q=loop');
  });
});
