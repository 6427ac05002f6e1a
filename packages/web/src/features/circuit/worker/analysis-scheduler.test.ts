import { analyze } from '@rolloff/solver';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { AnalysisReply, AnalysisRequest } from './analysis-messages';
import { AnalysisScheduler } from './analysis-scheduler';
import type { AnalysisOutcome, WorkerLike } from './analysis-scheduler';

/** A worker that answers only when the test says so, with the real solver's result. */
class FakeWorker implements WorkerLike {
  static made: FakeWorker[] = [];
  onmessage: ((event: MessageEvent<AnalysisReply>) => void) | null = null;
  onerror: ((event: ErrorEvent) => void) | null = null;
  received: AnalysisRequest[] = [];
  terminated = false;
  constructor() {
    FakeWorker.made.push(this);
  }
  postMessage(message: AnalysisRequest) {
    this.received.push(message);
  }
  terminate() {
    this.terminated = true;
  }
  answer(index = this.received.length - 1) {
    const request = this.received[index];
    this.onmessage?.({ data: { id: request.id, ok: true, result: analyze(request.text), elapsedMs: 1 } } as MessageEvent<AnalysisReply>);
  }
  crash(message: string) {
    this.onerror?.({ message, preventDefault: () => undefined } as ErrorEvent);
  }
}

const RC = 'drive in\nR1 [in out] 1k\nC1 [out gnd] 1u\nshow out';

describe('the analysis scheduler', () => {
  beforeEach(() => {
    FakeWorker.made = [];
    vi.useFakeTimers();
  });
  afterEach(() => vi.useRealTimers());

  it('runs one analysis at a time and delivers only the newest text of a cell', () => {
    const scheduler = new AnalysisScheduler(() => new FakeWorker());
    const delivered: AnalysisOutcome[] = [];
    scheduler.submit('cell', 'drive in\nR1 [in out] 1k\nC1 [out gnd] 1u\nshow out', (o) => delivered.push(o));
    scheduler.submit('cell', 'drive in\nR1 [in out] 2k\nC1 [out gnd] 1u\nshow out', (o) => delivered.push(o));
    scheduler.submit('cell', 'drive in\nR1 [in out] 3k\nC1 [out gnd] 1u\nshow out', (o) => delivered.push(o));
    const worker = FakeWorker.made[0];
    expect(worker.received).toHaveLength(1);
    worker.answer(0);
    // The first text's answer is stale; the newest text is sent next, the middle one never.
    expect(delivered).toEqual([]);
    expect(worker.received.map((r) => r.text.includes('3k'))).toEqual([false, true]);
    worker.answer(1);
    expect(delivered).toHaveLength(1);
    expect(delivered[0].text).toContain('3k');
    expect(delivered[0].ok && delivered[0].result.traces.length).toBe(1);
  });

  it('keeps cells apart: one cell’s new text does not drop another’s', () => {
    const scheduler = new AnalysisScheduler(() => new FakeWorker());
    const got: string[] = [];
    scheduler.submit('a', 'drive in\nR1 [in out] 1k\nC1 [out gnd] 1u\nshow out', () => got.push('a'));
    scheduler.submit('b', 'drive in\nR1 [in out] 1k\nC1 [out gnd] 2u\nshow out', () => got.push('b'));
    const worker = FakeWorker.made[0];
    worker.answer(0);
    worker.answer(1);
    expect(got).toEqual(['a', 'b']);
  });

  it('cancels a stale run that keeps the worker busy, by starting a fresh worker', () => {
    const scheduler = new AnalysisScheduler(() => new FakeWorker(), { cancelAfterMs: 200 });
    const delivered: AnalysisOutcome[] = [];
    scheduler.submit('cell', 'slow text', (o) => delivered.push(o));
    scheduler.submit('cell', 'drive in\nR1 [in out] 1k\nC1 [out gnd] 1u\nshow out', (o) => delivered.push(o));
    vi.advanceTimersByTime(199);
    expect(FakeWorker.made).toHaveLength(1);
    vi.advanceTimersByTime(1);
    expect(FakeWorker.made[0].terminated).toBe(true);
    expect(FakeWorker.made).toHaveLength(2);
    FakeWorker.made[1].answer(0);
    expect(delivered.map((o) => o.ok)).toEqual([true]);
  });

  it('reports a crashed worker as a failed outcome and recovers on the next text', () => {
    const scheduler = new AnalysisScheduler(() => new FakeWorker());
    const delivered: AnalysisOutcome[] = [];
    scheduler.submit('cell', 'x', (o) => delivered.push(o));
    FakeWorker.made[0].crash('out of memory');
    expect(delivered).toEqual([{ ok: false, text: 'x', message: 'out of memory' }]);
    scheduler.submit('cell', 'drive in\nR1 [in out] 1k\nC1 [out gnd] 1u\nshow out', (o) => delivered.push(o));
    expect(FakeWorker.made).toHaveLength(2);
    FakeWorker.made[1].answer(0);
    expect(delivered[1].ok).toBe(true);
  });

  it('stops a run past its time budget and says so, and runs the same text without a budget when asked', () => {
    const scheduler = new AnalysisScheduler(() => new FakeWorker(), { budgetMs: 1_000 });
    const delivered: AnalysisOutcome[] = [];
    scheduler.submit('cell', 'huge text', (o) => delivered.push(o));
    vi.advanceTimersByTime(999);
    expect(FakeWorker.made[0].terminated).toBe(false);
    vi.advanceTimersByTime(1);
    expect(FakeWorker.made[0].terminated).toBe(true);
    expect(delivered).toEqual([
      {
        ok: false,
        text: 'huge text',
        message: expect.stringMatching(/^solving it took longer than 1 s, so it was stopped.*make it smaller, or solve it anyway/),
        overBudget: true,
      },
    ]);

    scheduler.submit('cell', 'huge text', (o) => delivered.push(o), undefined, true);
    vi.advanceTimersByTime(60_000);
    const unbudgeted = FakeWorker.made[1];
    expect(unbudgeted.terminated).toBe(false);
    unbudgeted.onmessage?.({ data: { id: unbudgeted.received[0].id, ok: true, result: analyze(RC), elapsedMs: 60_000 } } as MessageEvent<AnalysisReply>);
    expect(delivered.map((o) => o.ok)).toEqual([false, true]);
  });

  it('does not hold an answered run to the budget', () => {
    const scheduler = new AnalysisScheduler(() => new FakeWorker(), { budgetMs: 1_000 });
    const delivered: AnalysisOutcome[] = [];
    scheduler.submit('cell', RC, (o) => delivered.push(o));
    FakeWorker.made[0].answer();
    vi.advanceTimersByTime(5_000);
    expect(FakeWorker.made[0].terminated).toBe(false);
    expect(delivered.map((o) => o.ok)).toEqual([true]);
  });

  it('delivers nothing for a released cell', () => {
    const scheduler = new AnalysisScheduler(() => new FakeWorker());
    const delivered: AnalysisOutcome[] = [];
    scheduler.submit('cell', 'drive in', (o) => delivered.push(o));
    scheduler.release('cell');
    FakeWorker.made[0].answer(0);
    expect(delivered).toEqual([]);
  });
});
