/**
 * The one request validator: zod schemas for the path parameters, the query and the body.
 * A refusal is a 400 `validation` (413 `too_large` for a value over a size limit) whose
 * message and `details.issues` name each field by its path (`cells.3.text`, `query.limit`).
 */
import type { Request, RequestHandler } from 'express';
import type { z } from 'zod';
import { TOO_LARGE_PARAM } from './contract/common.js';
import type { ValidationIssue } from './contract/common.js';
import { ApiError } from './errors.js';

export interface Schemas {
  params?: z.ZodType;
  query?: z.ZodType;
  body?: z.ZodType;
}

export type Input<S extends Schemas> = {
  [K in keyof S]: S[K] extends z.ZodType ? z.output<S[K]> : never;
};

const inputs = new WeakMap<Request, unknown>();
const parts = ['params', 'query', 'body'] as const;

function pathOf(part: (typeof parts)[number], path: PropertyKey[]): string {
  const inner = path.map(String).join('.');
  if (part === 'body') return inner;
  return inner ? `${part}.${inner}` : part;
}

function messageOf(issue: z.core.$ZodIssue, part: (typeof parts)[number], received: unknown): string {
  if (part === 'body' && issue.path.length === 0 && (received === undefined || received === null || typeof received !== 'object')) {
    return 'The request body must be a JSON object (sent with Content-Type: application/json).';
  }
  return issue.message;
}

/** Matches a UTF-16 surrogate standing alone: half of a character, which UTF-8 cannot store. */
const loneSurrogate = /\p{Cs}/u;

/** The path of the first string in `value` that holds a lone surrogate, or null. */
function loneSurrogateAt(value: unknown, path: PropertyKey[] = []): PropertyKey[] | null {
  if (typeof value === 'string') return loneSurrogate.test(value) ? path : null;
  if (typeof value !== 'object' || value === null) return null;
  for (const [key, item] of Object.entries(value)) {
    const found = loneSurrogateAt(item, [...path, Array.isArray(value) ? Number(key) : key]);
    if (found) return found;
  }
  return null;
}

export interface Validator<S extends Schemas> extends RequestHandler {
  /** The parsed, typed input of a request that passed this validator. */
  input(req: Request): Input<S>;
}

/** Middleware that parses the request with `schemas`; handlers read the result with `.input(req)`. */
export function validate<S extends Schemas>(schemas: S): Validator<S> {
  const middleware: RequestHandler = (req, _res, next) => {
    const parsed: Record<string, unknown> = {};
    const issues: ValidationIssue[] = [];
    let tooLarge = false;
    for (const part of parts) {
      const schema = schemas[part];
      if (!schema) continue;
      const received: unknown = req[part];
      // Refused rather than stored as U+FFFD: what is saved must be what was sent.
      const broken = loneSurrogateAt(received);
      if (broken) {
        issues.push({ path: pathOf(part, broken), message: 'The text holds half of a character (a lone UTF-16 surrogate); send well-formed Unicode.' });
        continue;
      }
      const result = schema.safeParse(received);
      if (result.success) {
        parsed[part] = result.data;
        continue;
      }
      for (const issue of result.error.issues) {
        const params = (issue as { params?: Record<string, unknown> }).params;
        if (params?.[TOO_LARGE_PARAM]) tooLarge = true;
        issues.push({ path: pathOf(part, issue.path), message: messageOf(issue, part, received) });
      }
    }
    if (issues.length > 0) {
      const summary = issues
        .slice(0, 5)
        .map((issue) => (issue.path ? `${issue.path}: ${issue.message}` : issue.message))
        .join('; ');
      next(new ApiError(tooLarge ? 'too_large' : 'validation', summary, { issues }));
      return;
    }
    inputs.set(req, parsed);
    next();
  };
  return Object.assign(middleware, {
    input(req: Request): Input<S> {
      const parsed = inputs.get(req);
      if (!parsed) throw new Error('validate(): input() read before the validator ran');
      return parsed as Input<S>;
    },
  });
}
