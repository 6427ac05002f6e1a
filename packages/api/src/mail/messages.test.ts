import { describe, expect, it } from 'vitest';
import { addedToNotebookMail, notebookLink, pinReplyMail, reviewDecidedMail, reviewRequestedMail } from './messages.js';

const context = { baseUrl: 'https://rolloff.example.com', notebook: { id: 'Ab3_xY9-kL0q', title: 'Anti-alias filter\nfor the converter' } };

describe('the e-mails', () => {
  it('link back to the notebook, to the review or to the pin', () => {
    expect(notebookLink(context)).toBe('https://rolloff.example.com/notebooks/Ab3_xY9-kL0q');
    const request = reviewRequestedMail(context, {
      reviewId: 7,
      round: 2,
      version: { number: 3, label: 'For review' },
      requester: 'Inês Carvalho',
      message: '',
    });
    expect(request.text).toContain('https://rolloff.example.com/notebooks/Ab3_xY9-kL0q?review=7');
    expect(request.text).toContain('https://rolloff.example.com/settings');
    const reply = pinReplyMail(context, { pinId: 12, cell: 'Circuit 2', revisionNumber: 1, trace: 'out', frequency: 48_000, author: 'Kenji Arai', body: 'ok' });
    expect(reply.text).toContain('https://rolloff.example.com/notebooks/Ab3_xY9-kL0q#pin-12');
  });

  it('keep subjects on one line and say what happened', () => {
    const decided = reviewDecidedMail(context, {
      reviewId: 7,
      round: 2,
      versionNumber: 3,
      reviewer: 'Kenji Arai',
      state: 'needs_changes',
      summary: 'Raise C1.\nThen check the phase margin.',
    });
    expect(decided.subject).toBe('Needs changes: “Anti-alias filter for the converter”, version 3');
    expect(decided.text).toContain('> Raise C1.\n> Then check the phase margin.');
    expect(reviewDecidedMail(context, { reviewId: 7, round: 2, versionNumber: 3, reviewer: 'Kenji Arai', state: 'signed_off', summary: '' }).subject).toBe(
      'Signed off: “Anti-alias filter for the converter”, version 3',
    );
    const long = addedToNotebookMail({ ...context, notebook: { ...context.notebook, title: 'x'.repeat(300) } }, { by: 'Mara Lindqvist', role: 'viewer' });
    expect(long.subject.length).toBeLessThan(160);
    expect(long.subject).not.toMatch(/\n/);
  });

  it('name the frequency of a pin with an SI prefix', () => {
    // 1/(2π·1 kΩ·100 nF) = 1591.549… Hz, an RC corner; four significant digits.
    const reply = pinReplyMail(context, {
      pinId: 1,
      cell: 'Circuit 2',
      revisionNumber: 2,
      trace: 'out',
      frequency: 1 / (2 * Math.PI * 1e3 * 100e-9),
      author: 'A',
      body: 'b',
    });
    expect(reply.text).toContain('the pin at 1.592 kHz on trace out of Circuit 2 (revision 2)');
  });
});
