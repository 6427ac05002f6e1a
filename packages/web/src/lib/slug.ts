/** A file-name stem for downloads: the title in lower-case words. */
export function slugOf(title: string): string {
  return (
    title
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-|-$/g, '')
      .slice(0, 60) || 'notebook'
  );
}
