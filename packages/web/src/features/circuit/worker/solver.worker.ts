/**
 * The solver's Web Worker: analyses one cell text per message, so typing never waits on the
 * numbers. Typed arrays of the result are transferred, not copied.
 */
import { analyze } from '@rolloff/solver';
import type { Result } from '@rolloff/solver';
import type { AnalysisReply, AnalysisRequest } from './analysis-messages';

const scope = self as unknown as DedicatedWorkerGlobalScope;

function buffersOf(result: Result): ArrayBuffer[] {
  const buffers = new Set<ArrayBuffer>();
  const add = (values: ArrayLike<number>) => {
    if (values instanceof Float64Array && values.buffer instanceof ArrayBuffer) buffers.add(values.buffer);
  };
  const traces = [...result.traces, ...(result.variants ?? []).flatMap((v) => v.traces)];
  [result.frequencies, ...(result.variants ?? []).map((v) => v.frequencies)].forEach(add);
  for (const trace of traces) [trace.re, trace.im, trace.magnitude, trace.magnitudeDb, trace.phaseDeg, trace.groupDelay].forEach(add);
  for (const step of result.steps) [step.times, step.values].forEach(add);
  for (const band of result.envelope) [band.minDb, band.maxDb, band.minPhaseDeg, band.maxPhaseDeg].forEach(add);
  return [...buffers];
}

scope.onmessage = (event: MessageEvent<AnalysisRequest>) => {
  const { id, text, maxPoints } = event.data;
  const started = performance.now();
  let reply: AnalysisReply;
  try {
    const result = analyze(text, maxPoints === undefined ? {} : { maxPoints });
    reply = { id, ok: true, result, elapsedMs: performance.now() - started };
  } catch (error) {
    reply = { id, ok: false, message: error instanceof Error ? error.message : String(error) };
  }
  scope.postMessage(reply, reply.ok ? buffersOf(reply.result) : []);
};
