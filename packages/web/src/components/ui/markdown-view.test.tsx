import { cleanup, render } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { MarkdownView } from './markdown-view';

describe('note cells', () => {
  afterEach(cleanup);

  it('render Markdown', () => {
    const { container } = render(<MarkdownView text={'# Tone network\n\nThe *treble* control:\n\n- 10k pot\n- 2n2 cap'} />);
    expect(container.querySelector('h3')?.textContent).toBe('Tone network');
    expect(container.querySelector('em')?.textContent).toBe('treble');
    expect(container.querySelectorAll('li')).toHaveLength(2);
  });

  it('let the keyboard reach a code block, which may scroll sideways', () => {
    const { container } = render(<MarkdownView text={'```\nR1 [in a] 10k\n```'} />);
    expect(container.querySelector('pre')?.getAttribute('tabindex')).toBe('0');
    expect(container.querySelector('pre code')?.textContent).toBe('R1 [in a] 10k\n');
  });

  it('never render raw HTML or script links', () => {
    const { container } = render(
      <MarkdownView text={'<script>window.hacked = true</script>\n\n<b onclick="x()">bold</b> [run](javascript:alert(1)) <img src=x onerror="alert(1)">'} />,
    );
    expect(container.querySelector('script')).toBeNull();
    expect(container.querySelector('b')).toBeNull();
    expect(container.querySelector('img')).toBeNull();
    expect(container.querySelector('a')?.getAttribute('href') ?? '').not.toMatch(/javascript:/i);
    expect((window as unknown as { hacked?: boolean }).hacked).toBeUndefined();
  });

  it('moves written headings under the page’s own, keeping their size and giving them anchors', () => {
    const { container } = render(<MarkdownView text={'# Goals\n\n## Pass band\n\ntext'} topLevel={3} />);
    expect(container.querySelector('h1')).toBeNull();
    expect([...container.querySelectorAll('h3, h4')].map((h) => [h.tagName, h.className, h.id])).toEqual([
      ['H3', 'md-h1', 'goals'],
      ['H4', 'md-h2', 'pass-band'],
    ]);
  });
});
