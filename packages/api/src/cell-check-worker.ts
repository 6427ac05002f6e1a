/**
 * A worker thread of the compile pool (cell-check-pool.ts): checks the circuit texts of one
 * request in turn, and stops at the first that is past the part cap (the request is refused).
 * It first says on `started` that the task runs, which is when the time budget begins.
 */
import type { MessagePort } from 'node:worker_threads';
import { checkCircuit } from './cell-check.js';
import type { CircuitCheck } from './cell-check.js';

export interface CheckTask {
  texts: string[];
  maxParts: number;
  started: MessagePort;
}

export default function checkTexts({ texts, maxParts, started }: CheckTask): CircuitCheck[] {
  started.postMessage(null);
  started.close();
  const checks: CircuitCheck[] = [];
  for (const text of texts) {
    const check = checkCircuit(text, maxParts);
    checks.push(check);
    if (check.tooLarge) break;
  }
  return checks;
}
