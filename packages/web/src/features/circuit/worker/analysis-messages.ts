/** The messages between the page and the solver's Web Worker. */
import type { Result } from '@rolloff/solver';

export interface AnalysisRequest {
  id: number;
  text: string;
  maxPoints?: number;
}

export type AnalysisReply = { id: number; ok: true; result: Result; elapsedMs: number } | { id: number; ok: false; message: string };
