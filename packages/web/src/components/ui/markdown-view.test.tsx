import { cleanup, render } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { MarkdownView } from './markdown-view';

describe('note cells', () => {
  afterEach(cleanup);

  it('render Markdown', () => {
    const { container } = render(<MarkdownView text={'# Tone network\n\nThe *treble* control:\n\n- 10k pot\n- 2n2 cap'} />);
    expect(container.querySelector('h1')?.textContent).toBe('Tone network');
    expect(container.querySelector('em')?.textContent).toBe('treble');
    expect(container.querySelectorAll('li')).toHaveLength(2);
  });

  it('never render raw HTML or script links', () => {
    const { container } = render(<MarkdownView text={'<script>window.hacked = true</script>\n\n<b onclick="x()">bold</b> [run](javascript:alert(1)) <img src=x onerror="alert(1)">'} />);
    expect(container.querySelector('script')).toBeNull();
    expect(container.querySelector('b')).toBeNull();
    expect(container.querySelector('img')).toBeNull();
    expect(container.querySelector('a')?.getAttribute('href') ?? '').not.toMatch(/javascript:/i);
    expect((window as unknown as { hacked?: boolean }).hacked).toBeUndefined();
  });
});
