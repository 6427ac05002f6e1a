/**
 * A Vite plugin that prints the gzipped size of every chunk after a production build, the
 * size of the first page (the entry chunk, everything it imports statically, and its CSS —
 * the lazily loaded chunks (notebook pages, editor, plots, solver worker) excluded), and the
 * minified size of the plot chunk (the one holding the plotting library). A first page or a
 * plot chunk over its budget fails the build, so the app cannot grow heavy by accident.
 */
import { gzipSync } from 'node:zlib';
import type { Plugin } from 'vite';
import { inPackage } from './compile-hints.ts';

export interface BundleReportOptions {
  /** Largest first page, gzipped, in bytes. */
  firstPageBudget: number;
  /** The chunk holding the plotting library: its package, and its largest size minified, in bytes. */
  plotChunk: { package: string; budget: number };
}

interface Entry {
  name: string;
  bytes: number;
  gzipped: number;
  kind: 'chunk' | 'asset';
}

const kB = (bytes: number) => `${(bytes / 1024).toFixed(1)} kB`;
const MB = (bytes: number) => `${(bytes / 1_000_000).toFixed(2)} MB`;

/** Prints the bundle report; fails the build when the first page or the plot chunk is over budget. */
export function bundleReport({ firstPageBudget, plotChunk }: BundleReportOptions): Plugin {
  return {
    name: 'rolloff-bundle-report',
    apply: 'build',
    generateBundle(_options, bundle) {
      const entries = new Map<string, Entry>();
      for (const [fileName, item] of Object.entries(bundle)) {
        if (fileName.endsWith('.map')) continue;
        const source = item.type === 'chunk' ? item.code : item.source;
        if (item.type === 'asset' && !/\.(js|css)$/.test(fileName)) continue;
        const buffer = typeof source === 'string' ? Buffer.from(source) : Buffer.from(source);
        entries.set(fileName, { name: fileName, bytes: buffer.length, gzipped: gzipSync(buffer, { level: 9 }).length, kind: item.type });
      }
      // The first page: the entry chunk and its static imports, transitively, with their CSS.
      const firstPage = new Set<string>();
      const visit = (fileName: string) => {
        const item = bundle[fileName];
        if (firstPage.has(fileName) || !item || item.type !== 'chunk') return;
        firstPage.add(fileName);
        for (const css of item.viteMetadata?.importedCss ?? []) firstPage.add(css);
        item.imports.forEach(visit);
      };
      for (const item of Object.values(bundle)) if (item.type === 'chunk' && item.isEntry) visit(item.fileName);
      const firstPageBytes = [...firstPage].reduce((sum, name) => sum + (entries.get(name)?.gzipped ?? 0), 0);
      const plotChunks = Object.values(bundle).filter((item) => item.type === 'chunk' && item.moduleIds.some((id) => inPackage(id, [plotChunk.package])));
      if (plotChunks.length !== 1)
        this.error(`Expected one chunk holding ${plotChunk.package}, found ${plotChunks.length}: the plot chunk's budget cannot be checked.`);
      const plot = entries.get(plotChunks[0].fileName) as Entry;

      const rows = [...entries.values()].sort((a, b) => b.gzipped - a.gzipped);
      const width = Math.max(...rows.map((r) => r.name.length), 10);
      const lines = [
        '',
        'Bundle report (gzip level 9)',
        `${'file'.padEnd(width)}  ${'size'.padStart(10)}  ${'gzipped'.padStart(10)}  first page`,
        ...rows.map((r) => `${r.name.padEnd(width)}  ${kB(r.bytes).padStart(10)}  ${kB(r.gzipped).padStart(10)}  ${firstPage.has(r.name) ? 'yes' : ''}`),
        `First page (without the lazy chunks): ${kB(firstPageBytes)} gzipped, budget ${kB(firstPageBudget)}.`,
        `Plot chunk (${plot.name}, with ${plotChunk.package}): ${MB(plot.bytes)} minified, budget ${MB(plotChunk.budget)}.`,
        '',
      ];
      console.log(lines.join('\n'));
      if (firstPageBytes > firstPageBudget) {
        this.error(`The first page is ${kB(firstPageBytes)} gzipped, over its budget of ${kB(firstPageBudget)}: load the new weight lazily.`);
      }
      if (plot.bytes > plotChunk.budget) {
        this.error(`The plot chunk is ${MB(plot.bytes)} minified, over its budget of ${MB(plotChunk.budget)}: it parses as one long task on the main thread.`);
      }
    },
  };
}
