/**
 * A Vite plugin that marks chunks for eager compilation: V8's explicit compile hint
 * (`//# allFunctionsCalledOnLoad` at the top of a file, Chrome 136 and later) makes the
 * browser compile every function of the file while it streams in, on a background thread.
 * Without it, a big library is compiled function by function as its set-up code first calls
 * them, on the main thread, in one long task: Plotly's took seconds with the CPU slowed four
 * times, and about 60 ms with the hint (packages/web/BENCHMARKS.md). Other browsers read the
 * line as a comment.
 */
import type { Plugin } from 'vite';

export interface CompileHintOptions {
  /** Packages whose chunks are compiled eagerly, e.g. the plotting library. */
  packages: readonly string[];
}

const HINT = '//# allFunctionsCalledOnLoad';

/** True when a module id lies in one of the packages' folders in node_modules. */
export function inPackage(moduleId: string, packages: readonly string[]): boolean {
  return packages.some((name) => moduleId.includes(`/node_modules/${name}/`));
}

/** Adds the compile hint, after minification, to each chunk holding a module of the packages. */
export function compileHints({ packages }: CompileHintOptions): Plugin {
  return {
    name: 'rolloff-compile-hints',
    apply: 'build',
    outputOptions(options) {
      return { ...options, postBanner: (chunk) => (chunk.moduleIds.some((id) => inPackage(id, packages)) ? HINT : '') };
    },
  };
}
