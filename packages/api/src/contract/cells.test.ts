import { describe, expect, it } from 'vitest';
import { cellName } from './cells.js';

describe('cellName', () => {
  it('names a cell by its kind and its 1-based place, and says when it is deleted', () => {
    expect(cellName({ kind: 'circuit', position: 1 })).toBe('Circuit 2');
    expect(cellName({ kind: 'note', position: 2 })).toBe('Note 3');
    expect(cellName({ kind: 'circuit', position: 0, deleted: true })).toBe('Circuit 1 (deleted)');
  });

  it('uses the title chosen for the cell when there is one', () => {
    expect(cellName({ kind: 'circuit', position: 1, title: 'Input filter' })).toBe('Input filter');
    expect(cellName({ kind: 'note', position: 1, title: null })).toBe('Note 2');
    expect(cellName({ kind: 'note', position: 1, title: 'Goals', deleted: true })).toBe('Goals (deleted)');
  });
});
