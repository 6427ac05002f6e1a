#!/usr/bin/env node
/**
 * The `rolloff` command line.
 *
 *   rolloff solve FILE|- [--json | --csv [--time]] [--trace LABEL]
 *   rolloff check FILE|- [--json]
 *
 * `--csv` prints the frequency table; with `--time`, the step traces' table instead.
 *
 * Exit status: 0 no errors and every requirement passes; 1 a requirement fails (or cannot
 * be checked); 2 errors in the cell (printed to stderr as FILE:LINE:COL: error: MESSAGE);
 * 3 bad arguments or unreadable input.
 */
import { readFileSync } from 'node:fs';
import { analyze } from './analyze.js';
import type { Result } from './result.js';
import { requirementText, toCsv, toJson, toStepCsv, toText } from './output.js';

const USAGE = `usage: rolloff solve FILE|- [--json | --csv [--time]] [--trace LABEL]
       rolloff check FILE|- [--json]`;

interface Args {
  command: 'solve' | 'check';
  file: string;
  format: 'text' | 'json' | 'csv';
  /** With --csv: the step traces' table (one row per time) instead of the frequency table. */
  time: boolean;
  trace?: string;
}

class UsageError extends Error {}

function parseArgs(argv: string[]): Args {
  const [command, ...rest] = argv;
  if (command !== 'solve' && command !== 'check') {
    throw new UsageError(command === undefined ? 'no command given' : `unknown command "${command}"`);
  }
  let file: string | undefined;
  let format: Args['format'] = 'text';
  let trace: string | undefined;
  let time = false;
  for (let i = 0; i < rest.length; i++) {
    const a = rest[i];
    if (a === '--time') {
      if (command === 'check') throw new UsageError('check prints no traces, so --time does not apply');
      time = true;
    } else if (a === '--json' || a === '--csv') {
      const f = a === '--json' ? 'json' : 'csv';
      if (format !== 'text' && format !== f) throw new UsageError('choose one of --json and --csv');
      if (command === 'check' && f === 'csv') throw new UsageError('check prints no traces, so --csv does not apply');
      format = f;
    } else if (a === '--trace' || a.startsWith('--trace=')) {
      if (command === 'check') throw new UsageError('check prints no traces, so --trace does not apply');
      const value = a === '--trace' ? rest[++i] : a.slice('--trace='.length);
      if (value === undefined || value === '') throw new UsageError('--trace needs a trace label');
      trace = value;
    } else if (a.startsWith('-') && a !== '-') {
      throw new UsageError(`unknown option "${a}"`);
    } else if (file === undefined) {
      file = a;
    } else {
      throw new UsageError(`one input at a time ("${file}", then "${a}")`);
    }
  }
  if (file === undefined) throw new UsageError('no input: give a file, or - for standard input');
  if (time && format !== 'csv') throw new UsageError('--time chooses the CSV table of the step traces: use it with --csv');
  return { command, file, format, time, trace };
}

function exitCode(result: Result): number {
  if (result.diagnostics.some((d) => d.severity === 'error')) return 2;
  if (result.requirements.some((r) => r.status !== 'pass')) return 1;
  return 0;
}

function main(argv: string[]): number {
  if (argv[0] === '--help' || argv[0] === '-h' || argv[0] === 'help') {
    process.stdout.write(USAGE + '\n');
    return 0;
  }
  let args: Args;
  try {
    args = parseArgs(argv);
  } catch (error) {
    if (!(error instanceof UsageError)) throw error;
    process.stderr.write(`rolloff: ${error.message}\n${USAGE}\n`);
    return 3;
  }
  let text: string;
  try {
    text = readFileSync(args.file === '-' ? 0 : args.file, 'utf8');
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    process.stderr.write(`rolloff: cannot read ${args.file === '-' ? 'standard input' : args.file}: ${reason}\n`);
    return 3;
  }
  const name = args.file === '-' ? '<stdin>' : args.file;
  const result = analyze(text);
  for (const d of result.diagnostics) {
    process.stderr.write(`${name}:${d.line}:${d.column}: ${d.severity}: ${d.message}\n`);
    if (d.hint) process.stderr.write(`${name}:${d.line}:${d.column}: note: ${d.hint}\n`);
  }
  if (args.trace !== undefined && !result.diagnostics.some((d) => d.severity === 'error')) {
    if (!result.traces.some((t) => t.label === args.trace) && !result.steps.some((t) => t.label === args.trace)) {
      const labels = [...result.traces, ...result.steps].map((t) => `"${t.label}"`).join(', ');
      process.stderr.write(`rolloff: no trace labelled "${args.trace}"${labels ? `; the traces are ${labels}` : ''}\n`);
      return 3;
    }
  }
  if (args.command === 'check') {
    if (args.format === 'json') {
      process.stdout.write(JSON.stringify({ diagnostics: result.diagnostics, requirements: result.requirements }) + '\n');
    } else if (!result.diagnostics.some((d) => d.severity === 'error')) {
      if (result.requirements.length === 0) process.stdout.write('no requirements\n');
      for (const q of result.requirements) process.stdout.write(requirementText(q, result.variants) + '\n');
    }
  } else if (args.format === 'json') {
    process.stdout.write(toJson(result, { trace: args.trace }) + '\n');
  } else if (args.format === 'csv') {
    process.stdout.write(args.time ? toStepCsv(result, { trace: args.trace }) : toCsv(result, { trace: args.trace }));
  } else if (!result.diagnostics.some((d) => d.severity === 'error')) {
    process.stdout.write(toText(result, { trace: args.trace }));
  }
  return exitCode(result);
}

// A reader that stops early (`rolloff solve --csv | head`) closes the pipe: that is not an error.
process.stdout.on('error', (error: NodeJS.ErrnoException) => {
  if (error.code !== 'EPIPE') throw error;
  process.exit(process.exitCode ?? 0);
});
process.exitCode = main(process.argv.slice(2));
