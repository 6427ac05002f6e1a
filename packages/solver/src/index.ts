/**
 * @rolloff/solver: the cell language and its analysis. `parse` reads a cell, `compile`
 * elaborates it into a network, `analyze` solves it into the traces, readouts and
 * requirement results that every screen draws. None of them throws.
 */
export type * from './circuit.js';
export type * from './result.js';
export { READOUT_NAMES, STATUS_WORDS } from './result.js';
export type { Program } from './ast.js';
export type { Line, Token, TokenKind } from './lexer.js';
export { parse } from './parser/index.js';
export { lex, separateUnit } from './lexer.js';
export * from './vocabulary.js';
export { modernizeCellText } from './modernize.js';
export { compile } from './compile.js';
export { DEFAULT_MAX_PARTS } from './elaborate/index.js';
export { DEFAULT_MAX_POINTS } from './sweep.js';
export { analyze } from './analyze.js';
export { HAZARDOUS_VOLTAGE } from './cautions.js';
export { FIRST_EXAMPLE } from './examples.js';
export { toCsv, toJson, toStepCsv } from './output.js';
export { formatReading, formatSi, parseSi } from './units.js';
