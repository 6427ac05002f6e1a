/** The text with a line break at its end, so a last line compares equal with or without one. */
export function withFinalNewline(text: string): string {
  return text === '' || text.endsWith('\n') ? text : `${text}\n`;
}
