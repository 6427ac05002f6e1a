/**
 * Text from a cell (a label, a requirement's words) as Plotly shows it: Plotly reads names,
 * hover text and annotations as a small subset of HTML, links included, so `<`, `>` and `&`
 * become entities, which it shows as the characters themselves.
 */
export function plotText(text: string): string {
  return text.replace(/[<>&]/g, (c) => ({ '<': '&lt;', '>': '&gt;', '&': '&amp;' })[c] ?? c);
}

/** A name of a figure back as the cell wrote it (for the CSV's header, which is not HTML). */
export function fromPlotText(text: string): string {
  return text.replace(/&(lt|gt|amp);/g, (_, entity: string) => ({ lt: '<', gt: '>', amp: '&' })[entity] ?? '');
}
