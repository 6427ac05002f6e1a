import { describe, expect, it } from 'vitest';
import { escapeHtml } from './html.js';

describe('escapeHtml', () => {
  it('escapes the five characters that can open markup or close an attribute, and nothing else', () => {
    expect(escapeHtml(`<a href="x" title='y'>Tom & Jerry</a> ±1 % µ`)).toBe('&lt;a href=&quot;x&quot; title=&#39;y&#39;&gt;Tom &amp; Jerry&lt;/a&gt; ±1 % µ');
  });
});
