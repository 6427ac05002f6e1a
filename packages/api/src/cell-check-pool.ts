/**
 * The server's checks of circuit cells run here, off the event loop: a pool of worker threads
 * (piscina) compiles the texts of one request within a budget, so one heavy cell never stalls
 * anyone else's request. Past the part cap, past the time (the thread is then terminated and
 * replaced) or past the memory, the request is refused with 413 `too_large` before anything is
 * written, and the answer says what was too big and what to do.
 */
import { MessageChannel } from 'node:worker_threads';
import { Piscina } from 'piscina';
import type { CircuitCheck } from './cell-check.js';
import type { CheckTask } from './cell-check-worker.js';
import { cellCheckConfig } from './config.js';
import type { CellCheckConfig } from './config.js';
import type { DiagnosticCounts } from './contract/common.js';
import { ApiError, unavailable } from './errors.js';

/** Heap of one worker thread: the solver's part cap keeps a check far below it. */
const workerHeapMb = 256;
/** Checks waiting for a thread, per thread, before new ones are turned away with 503. */
const queuePerThread = 32;

let budget: CellCheckConfig = cellCheckConfig();
let pool: Piscina<CheckTask, CircuitCheck[]> | null = null;

/**
 * The worker module beside this one: the built `.js`, or under tsx and Vitest the `.ts`
 * source, which the thread then loads through tsx too.
 */
function workerOptions(): { filename: string; execArgv?: string[] } {
  const fromSource = import.meta.url.endsWith('.ts');
  const filename = new URL(`./cell-check-worker.${fromSource ? 'ts' : 'js'}`, import.meta.url).href;
  return fromSource ? { filename, execArgv: ['--import', 'tsx'] } : { filename };
}

function thePool(): Piscina<CheckTask, CircuitCheck[]> {
  pool ??= new Piscina<CheckTask, CircuitCheck[]>({
    ...workerOptions(),
    // One thread stays ready (a new one starts at once when one is terminated).
    minThreads: 1,
    maxThreads: budget.threads,
    idleTimeout: 60_000,
    maxQueue: budget.threads * queuePerThread,
    resourceLimits: { maxOldGenerationSizeMb: workerHeapMb },
  });
  return pool;
}

/** Sets the budget (the app's settings; tests lower it) and starts a new pool for it. */
export function setCellCheckBudget(next: CellCheckConfig): void {
  void closeCellChecks();
  budget = next;
}

/** Stops the pool's threads (a server stopping). */
export async function closeCellChecks(): Promise<void> {
  const closing = pool;
  pool = null;
  await closing?.destroy();
}

const partsFormat = new Intl.NumberFormat('en-GB');

function overParts(): ApiError {
  const limit = partsFormat.format(budget.maxParts);
  return new ApiError(
    'too_large',
    `This circuit has more than ${limit} parts once its blocks are expanded, more than the server checks when it saves a cell. Nothing was saved: split the network into smaller cells or use fewer block instances, then save again.`,
    { budget: 'parts', limit: budget.maxParts },
  );
}

function overTime(): ApiError {
  const seconds = budget.timeMs / 1000;
  return new ApiError(
    'too_large',
    `Checking this circuit took longer than the ${seconds} s the server allows a save. Nothing was saved: make the network smaller (fewer block instances, fewer levels of blocks), then save again.`,
    { budget: 'time', limit: budget.timeMs },
  );
}

function isAbort(error: unknown): boolean {
  return error instanceof Error && error.name === 'AbortError';
}

function isOutOfMemory(error: unknown): boolean {
  return (error as { code?: string } | null)?.code === 'ERR_WORKER_OUT_OF_MEMORY';
}

/**
 * Runs one task, aborted (its thread terminated) once it has run for `timeMs`. The time counts
 * from when a thread takes the task, so neither waiting in the queue nor a thread starting up
 * eats into a request's budget.
 */
async function runTimed(texts: string[], maxParts: number, timeMs: number): Promise<CircuitCheck[]> {
  const { port1, port2 } = new MessageChannel();
  const abort = new AbortController();
  let timer: NodeJS.Timeout | undefined;
  port1.once('message', () => {
    timer = setTimeout(() => abort.abort(), timeMs);
  });
  try {
    return await thePool().run({ texts, maxParts, started: port2 }, { signal: abort.signal, transferList: [port2] });
  } finally {
    clearTimeout(timer);
    port1.close();
  }
}

/** The checks of `texts` within the budget; throws the refusal when one is past it. */
async function checkTexts(texts: string[]): Promise<CircuitCheck[]> {
  if (texts.length === 0) return [];
  let checks: CircuitCheck[];
  try {
    checks = await runTimed(texts, budget.maxParts, budget.timeMs);
  } catch (error) {
    if (isAbort(error)) throw overTime();
    if (isOutOfMemory(error)) throw overParts();
    if (error instanceof Error && error.message === 'Task queue is at limit')
      throw unavailable('The server is busy checking other cells; try again in a moment.');
    throw error;
  }
  if (checks.some((check) => check.tooLarge)) throw overParts();
  return checks;
}

/** Diagnostic counts of each cell of one request (null for note cells, which are not checked). */
export async function checkCells(cells: { kind: 'circuit' | 'note'; text: string }[]): Promise<(DiagnosticCounts | null)[]> {
  const checks = await checkTexts(cells.filter((cell) => cell.kind === 'circuit').map((cell) => cell.text));
  let next = 0;
  return cells.map((cell) => (cell.kind === 'circuit' ? checks[next++]!.counts : null));
}

/** Diagnostic counts of one cell (null for a note). */
export async function checkCell(kind: 'circuit' | 'note', text: string): Promise<DiagnosticCounts | null> {
  const [counts] = await checkCells([{ kind, text }]);
  return counts ?? null;
}

/** The labels of the traces a circuit text shows, or null when it has errors and so shows none. */
export async function shownTraces(text: string): Promise<string[] | null> {
  const [check] = await checkTexts([text]);
  return check!.traces;
}
