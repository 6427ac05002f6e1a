/**
 * Runs cell analyses on one Web Worker, one at a time, the newest text of each cell winning.
 * A result for a text that has since been replaced is dropped; a run that is already stale
 * and still busy after `cancelAfterMs` is cancelled by replacing the worker, so a slow
 * network never holds up the text the user is looking at.
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

export type AnalysisOutcome = { ok: true; text: string; result: Result; elapsedMs: number } | { ok: false; text: string; message: string };

interface Job {
  id: number;
  text: string;
  maxPoints?: number;
  deliver: (outcome: AnalysisOutcome) => void;
}

export interface SchedulerOptions {
  /** How long a stale run may keep the worker busy before it is cancelled. */
  cancelAfterMs?: number;
}

export class AnalysisScheduler {
  private worker: WorkerLike | null = null;
  private readonly pending = new Map<string, Job>();
  private readonly latest = new Map<string, number>();
  private running: { key: string; job: Job; startedAt: number } | null = null;
  private cancelTimer: ReturnType<typeof setTimeout> | null = null;
  private sequence = 0;
  private readonly cancelAfterMs: number;

  constructor(
    private readonly createWorker: () => WorkerLike,
    options: SchedulerOptions = {},
  ) {
    this.cancelAfterMs = options.cancelAfterMs ?? 250;
  }

  /** Asks for `text` of cell `key` to be analysed; any older request of that cell is dropped. */
  submit(key: string, text: string, deliver: Job['deliver'], maxPoints?: number): void {
    const id = ++this.sequence;
    this.latest.set(key, id);
    this.pending.set(key, { id, text, maxPoints, deliver });
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
  }

  private onReply(reply: AnalysisReply): void {
    const running = this.running;
    if (!running || reply.id !== running.job.id) return;
    this.running = null;
    this.clearCancel();
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

  private replaceWorker(): void {
    this.clearCancel();
    this.worker?.terminate();
    this.worker = null;
    this.running = null;
  }
}
