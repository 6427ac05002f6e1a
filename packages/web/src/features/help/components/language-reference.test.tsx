import { describe, expect, it } from 'vitest';
import { sectionsOf } from './language-reference';

describe('the language reference’s table of contents', () => {
  it('lists the ## sections with the anchors their headings get', () => {
    const markdown = '# Title\n\n## A first cell\n\ntext\n\n### Numbers\n\n## `drive` — the stimulus\n';
    expect(sectionsOf(markdown)).toEqual([
      { title: 'A first cell', anchor: 'a-first-cell' },
      { title: 'drive — the stimulus', anchor: 'drive-the-stimulus' },
    ]);
  });
});
