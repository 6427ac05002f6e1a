/**
 * From the cell as written to the network the numerical core solves: parameters resolved
 * in order, blocks flattened (instance-private nodes `B1.x`, designators `B1.R3`), nodes
 * numbered (0 is gnd), units and values checked per part, connectivity checked, and every
 * `show` and `require` mapped to what it reads. Never throws. The steps share one
 * `Elaboration` (context.ts); each kind of line has its module.
 */
import type { Circuit, RequirementSpec, SweepSpec, ToleranceSpec, TraceSpec } from '../circuit.js';
import type { Diagnostic } from '../result.js';
import type { DriveStatement, Program, ShowStatement } from '../ast.js';
import { internalError } from '../diagnostic.js';
import { DEFAULT_MAX_POINTS } from '../sweep.js';
import { DEFAULT_TEMPERATURE } from '../vocabulary.js';
import { CASCADE, Elaboration } from './context.js';
import { checkNamespace, letStatement } from './values.js';
import { partStatement, registerBlocks, tooLarge, warnUnusedBlocks } from './parts.js';
import { driveStatement } from './drive.js';
import { checkLabels, showStatement } from './show.js';
import { spreadStatement, sweepStatement, temperatureStatement, timeStatement } from './settings.js';
import { requireStatement } from './require.js';
import { wholeCellChecks } from './checks.js';
import { varyStatements } from './vary.js';
import type { VarySpec } from './vary.js';

export interface ElaborateOptions {
  /** Most frequency points a sweep may have (default `DEFAULT_MAX_POINTS`). */
  maxPoints?: number;
  /** Most parts a network may have after blocks are flattened (default 500 000). */
  maxParts?: number;
  /** Values that replace those of top-level `let` lines (one variant of a `vary` line). */
  overrides?: ReadonlyMap<string, number>;
}

export const DEFAULT_MAX_PARTS = 500_000;

/** Turns a parsed cell into a circuit. The circuit is null when any error was found. */
export function elaborate(program: Program, options: ElaborateOptions = {}): { circuit: Circuit | null; diagnostics: Diagnostic[]; vary?: VarySpec } {
  try {
    const cx = new Elaboration(program, options.maxPoints ?? DEFAULT_MAX_POINTS, options.maxParts ?? DEFAULT_MAX_PARTS, options.overrides);
    const statements = program.statements;

    registerBlocks(cx);
    checkNamespace(cx, cx.top, statements);
    for (const st of statements) if (st.kind === 'let') letStatement(cx, cx.top, st);
    if (tooLarge(cx)) return { circuit: null, diagnostics: cx.diagnostics };

    for (const st of statements) partStatement(cx, cx.top, st);
    for (const check of cx.pending) check();
    warnUnusedBlocks(cx);

    const drives = statements.filter((s): s is DriveStatement => s.kind === 'drive');
    for (const d of drives) driveStatement(cx, d);

    const shows = statements.filter((s): s is ShowStatement => s.kind === 'show');
    const traces: (TraceSpec | null)[] = shows.map((s) => showStatement(cx, s));
    checkLabels(cx, shows, traces);

    const { sweep, time, temperature, tolerance, requirements } = settingsAndRequirements(cx, shows, traces);

    wholeCellChecks(cx, shows, traces, drives);
    const vary = varyStatements(cx, sweep);

    const diagnostics = cx.diagnostics.filter((d) => d.code !== CASCADE);
    if (program.incomplete || diagnostics.some((d) => d.severity === 'error')) return { circuit: null, diagnostics };
    const circuit: Circuit = {
      nodeNames: cx.nodes.map((n) => n.name),
      elements: cx.elements,
      drive: cx.drive,
      traces: traces.filter((t): t is TraceSpec => t !== null),
      sweep,
      requirements,
      tolerance,
      temperature,
      time,
    };
    return vary === null ? { circuit, diagnostics } : { circuit, diagnostics, vary };
  } catch (err) {
    return { circuit: null, diagnostics: [internalError(err)] };
  }
}

/** The one-of-a-kind lines (each at most once) and the requirements, in the order written. */
function settingsAndRequirements(
  cx: Elaboration,
  shows: ShowStatement[],
  traces: (TraceSpec | null)[],
): Pick<Circuit, 'sweep' | 'time' | 'temperature' | 'tolerance' | 'requirements'> {
  let sweep: SweepSpec | null = null;
  let sweepLine = 0;
  let time: Circuit['time'] = null;
  let timeLine = 0;
  let temperature = DEFAULT_TEMPERATURE;
  let temperatureLine = 0;
  let tolerance: ToleranceSpec | null = null;
  const requirements: RequirementSpec[] = [];
  for (const st of cx.program.statements) {
    switch (st.kind) {
      case 'sweep':
        if (sweepLine !== 0) {
          cx.error(st.range, 'duplicate-sweep', `a cell has one sweep; there is one on line ${sweepLine} already`, 'keep one sweep line');
          break;
        }
        sweepLine = st.range.line;
        sweep = sweepStatement(cx, st);
        break;
      case 'time':
        if (timeLine !== 0) {
          cx.error(st.range, 'duplicate-time', `a cell has one time window; there is one on line ${timeLine} already`, 'keep one time line');
          break;
        }
        timeLine = st.range.line;
        time = timeStatement(cx, st);
        if (time !== null && !shows.some((show) => show.mode === 'step')) {
          cx.warn(st.range, 'time-unused', 'this time window has no step trace to apply to', 'show a step response with show step EXPR');
        }
        break;
      case 'temperature': {
        if (temperatureLine !== 0) {
          cx.error(
            st.range,
            'duplicate-temperature',
            `a cell has one temperature; there is one on line ${temperatureLine} already`,
            'keep one temperature line',
          );
          break;
        }
        temperatureLine = st.range.line;
        temperature = temperatureStatement(cx, st) ?? DEFAULT_TEMPERATURE;
        break;
      }
      case 'spread':
        if (tolerance !== null) {
          cx.error(st.range, 'duplicate-spread', `a cell has one spread; there is one on line ${tolerance.range.line} already`, 'keep one spread line');
          break;
        }
        tolerance = spreadStatement(cx, st);
        break;
      case 'require': {
        const r = requireStatement(cx, st, shows, traces);
        if (r !== null) requirements.push(r);
        break;
      }
      default:
        break;
    }
  }

  return { sweep, time, temperature, tolerance, requirements };
}
