/**
 * The words of each e-mail: a subject that says what happened and in which notebook, a few
 * lines of plain text, a link back to the notebook, and where to turn such mail off.
 */
import { formatSi } from '@rolloff/solver';
import type { DecisionState } from '../contract/reviews.js';

export interface ComposedMail {
  subject: string;
  text: string;
}

/** What every message needs to know about the notebook and the address people open. */
export interface MailContext {
  /** PUBLIC_URL, or the address the request came to. */
  baseUrl: string;
  notebook: { id: string; title: string };
}

/** One line, not too long: a title can hold anything a person typed. */
function oneLine(text: string, max = 120): string {
  const line = text.replace(/\s+/g, ' ').trim();
  return line.length > max ? `${line.slice(0, max - 1)}…` : line;
}

const quoted = (title: string) => `“${oneLine(title)}”`;

/** `PUBLIC_URL/notebooks/:id`, with a query or anchor that opens the right place. */
export function notebookLink(context: MailContext, suffix = ''): string {
  return `${context.baseUrl}/notebooks/${encodeURIComponent(context.notebook.id)}${suffix}`;
}

/** Indents a person's Markdown as a quote, so it reads as theirs. */
const quote = (text: string) =>
  text
    .split('\n')
    .map((line) => `> ${line}`)
    .join('\n');

function footer(context: MailContext, why: string): string {
  return `\n\n--\n${why} Turn these e-mails off under Settings: ${context.baseUrl}/settings`;
}

export function reviewRequestedMail(
  context: MailContext,
  input: { reviewId: number; round: number; version: { number: number; label: string }; requester: string; message: string },
): ComposedMail {
  const link = notebookLink(context, `?review=${input.reviewId}`);
  const lines = [
    `${input.requester} asks you to review version ${input.version.number} (${oneLine(input.version.label)}) of ${quoted(context.notebook.title)}, round ${input.round}.`,
  ];
  if (input.message) lines.push('', quote(input.message));
  lines.push('', `Open the review: ${link}`, '', 'Read the version, pin comments at a frequency on its plots, then ask for changes or sign off.');
  return {
    subject: `Review requested: ${quoted(context.notebook.title)}, version ${input.version.number}`,
    text: lines.join('\n') + footer(context, 'You get this because you were asked to review.'),
  };
}

export function reviewDecidedMail(
  context: MailContext,
  input: { reviewId: number; round: number; versionNumber: number; reviewer: string; state: DecisionState; summary: string },
): ComposedMail {
  const link = notebookLink(context, `?review=${input.reviewId}`);
  const version = `version ${input.versionNumber} of ${quoted(context.notebook.title)}`;
  const decided = input.state === 'signed_off' ? `signed off ${version}` : `says ${version} needs changes`;
  const lines = [`${input.reviewer} ${decided} (round ${input.round}).`];
  if (input.summary) lines.push('', quote(input.summary));
  lines.push('', `Open the review: ${link}`);
  return {
    subject: `${input.state === 'signed_off' ? 'Signed off' : 'Needs changes'}: ${quoted(context.notebook.title)}, version ${input.versionNumber}`,
    text: lines.join('\n') + footer(context, 'You get this because you asked for this review or edit this notebook.'),
  };
}

export function pinReplyMail(
  context: MailContext,
  input: { pinId: number; cell: string; revisionNumber: number; trace: string; frequency: number; author: string; body: string },
): ComposedMail {
  const link = notebookLink(context, `#pin-${input.pinId}`);
  const where = `the pin at ${formatSi(input.frequency, 'Hz')} on trace ${oneLine(input.trace, 60)} of ${input.cell} (revision ${input.revisionNumber})`;
  return {
    subject: `New reply on a pin in ${quoted(context.notebook.title)}`,
    text:
      [`${input.author} replied on ${where} in ${quoted(context.notebook.title)}:`, '', quote(input.body), '', `Open the thread: ${link}`].join('\n') +
      footer(context, 'You get this because you are in this pin thread.'),
  };
}

export function addedToNotebookMail(context: MailContext, input: { by: string; role: 'editor' | 'reviewer' | 'viewer' }): ComposedMail {
  const can = { editor: 'edit its cells and make versions', reviewer: 'read it, pin comments and sign off reviews', viewer: 'read it and fork it' }[input.role];
  return {
    subject: `You were added to ${quoted(context.notebook.title)}`,
    text:
      [
        `${input.by} gave you the ${input.role} role in ${quoted(context.notebook.title)}: you may ${can}.`,
        '',
        `Open the notebook: ${notebookLink(context)}`,
      ].join('\n') + footer(context, 'You get this because someone shared a notebook with you.'),
  };
}
