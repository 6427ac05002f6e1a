/**
 * Runs cell analyses on one Web Worker, one at a time, the newest text of each cell winning.
 * A result for a text that has since been replaced is dropped; a run that is already stale
 * and still busy after `cancelAfterMs` is cancelled by replacing the worker, so a slow
 * network never holds up the text the user is looking at. A run still busy after `budgetMs`
 * is stopped the same way and reported `overBudget`, unless it was asked for without a budget
 * (the person chose to solve that cell anyway).
 */
import type { Result } from '@rolloff/solver';
import type { AnalysisReply, AnalysisRequest } from './analysis-messages';

/** The part of a Worker the scheduler uses (a fake one stands in for it in tests). */
export interface WorkerLike {
  postMessage(message: AnalysisRequest): void;
  terminate(): void;
  onmessage: ((event: MessageEvent<AnalysisReply>) => void) | null;
  onerror: ((event: ErrorEvent) => void) | null;
}

export type AnalysisOutcome = { ok: true; text: string; result: Result; elapsedMs: number } | { ok: false; text: string; message: string; overBudget?: true };

/** How long one analysis may run in the browser before it is stopped and the person asked. */
export const SOLVE_BUDGET_MS = 5_000;

interface Job {
  id: number;
  text: string;
  maxPoints?: number;
  /** Run without the time budget. */
  unbudgeted: boolean;
  deliver: (outcome: AnalysisOutcome) => void;
}

export interface SchedulerOptions {
  /** How long a stale run may keep the worker busy before it is cancelled. */
  cancelAfterMs?: number;
  /** How long any run may take before it is stopped (default `SOLVE_BUDGET_MS`). */
  budgetMs?: number;
}

export class AnalysisScheduler {
  private worker: WorkerLike | null = null;
  private readonly pending = new Map<string, Job>();
  private readonly latest = new Map<string, number>();
  private running: { key: string; job: Job; startedAt: number } | null = null;
  private cancelTimer: ReturnType<typeof setTimeout> | null = null;
  private budgetTimer: ReturnType<typeof setTimeout> | null = null;
  private readonly budgetMs: number;
  private sequence = 0;
  private readonly cancelAfterMs: number;

  constructor(
    private readonly createWorker: () => WorkerLike,
    options: SchedulerOptions = {},
  ) {
    this.cancelAfterMs = options.cancelAfterMs ?? 250;
    this.budgetMs = options.budgetMs ?? SOLVE_BUDGET_MS;
  }

  /**
   * Asks for `text` of cell `key` to be analysed; any older request of that cell is dropped.
   * `unbudgeted` lets it run past the time budget.
   */
  submit(key: string, text: string, deliver: Job['deliver'], maxPoints?: number, unbudgeted = false): void {
    const id = ++this.sequence;
    this.latest.set(key, id);
    this.pending.set(key, { id, text, maxPoints, unbudgeted, deliver });
    if (this.running?.key === key) this.scheduleCancel();
    this.pump();
  }

  /** Forgets a cell (its editor went away): nothing more is delivered for it. */
  release(key: string): void {
    this.pending.delete(key);
    this.latest.delete(key);
  }

  /** Stops the worker and forgets everything. */
  dispose(): void {
    this.clearCancel();
    this.clearBudget();
    this.worker?.terminate();
    this.worker = null;
    this.running = null;
    this.pending.clear();
    this.latest.clear();
  }

  private ensureWorker(): WorkerLike {
    if (this.worker) return this.worker;
    const worker = this.createWorker();
    worker.onmessage = (event) => this.onReply(event.data);
    worker.onerror = (event) => {
      event.preventDefault?.();
      this.onFailure(event.message || 'The solver stopped unexpectedly.');
    };
    this.worker = worker;
    return worker;
  }

  private pump(): void {
    if (this.running) return;
    const next = this.pending.entries().next();
    if (next.done) return;
    const [key, job] = next.value;
    this.pending.delete(key);
    this.running = { key, job, startedAt: Date.now() };
    const request: AnalysisRequest = { id: job.id, text: job.text };
    if (job.maxPoints !== undefined) request.maxPoints = job.maxPoints;
    this.ensureWorker().postMessage(request);
    if (!job.unbudgeted) this.budgetTimer = setTimeout(() => this.overBudget(job), this.budgetMs);
  }

  /** The run of `job` took longer than the budget: stop it and say so. */
  private overBudget(job: Job): void {
    this.budgetTimer = null;
    const running = this.running;
    if (running?.job !== job) return;
    this.replaceWorker();
    if (this.latest.get(running.key) === job.id) {
      const seconds = this.budgetMs / 1000;
      job.deliver({
        ok: false,
        text: job.text,
        message: `solving it took longer than ${seconds} s, so it was stopped to keep this page responsive. Its network may be very large (many block instances); make it smaller, or solve it anyway and wait.`,
        overBudget: true,
      });
    }
    this.pump();
  }

  private onReply(reply: AnalysisReply): void {
    const running = this.running;
    if (!running || reply.id !== running.job.id) return;
    this.running = null;
    this.clearCancel();
    this.clearBudget();
    if (this.latest.get(running.key) === reply.id) {
      running.job.deliver(
        reply.ok
          ? { ok: true, text: running.job.text, result: reply.result, elapsedMs: reply.elapsedMs }
          : { ok: false, text: running.job.text, message: reply.message },
      );
    }
    this.pump();
  }

  private onFailure(message: string): void {
    const running = this.running;
    this.replaceWorker();
    if (running && this.latest.get(running.key) === running.job.id) running.job.deliver({ ok: false, text: running.job.text, message });
    this.pump();
  }

  private scheduleCancel(): void {
    if (this.cancelTimer || !this.running) return;
    const waited = Date.now() - this.running.startedAt;
    this.cancelTimer = setTimeout(
      () => {
        this.cancelTimer = null;
        const running = this.running;
        if (running && this.latest.get(running.key) !== running.job.id) {
          this.replaceWorker();
          this.pump();
        }
      },
      Math.max(0, this.cancelAfterMs - waited),
    );
  }

  private clearCancel(): void {
    if (this.cancelTimer) clearTimeout(this.cancelTimer);
    this.cancelTimer = null;
  }

  private clearBudget(): void {
    if (this.budgetTimer) clearTimeout(this.budgetTimer);
    this.budgetTimer = null;
  }

  private replaceWorker(): void {
    this.clearCancel();
    this.clearBudget();
    this.worker?.terminate();
    this.worker = null;
    this.running = null;
  }
}
