/**
 * @rolloff/solver: the cell language and its analysis. `parse` reads a cell, `compile`
 * elaborates it into a network, `analyze` solves it into the traces, readouts and
 * requirement results that every screen draws. None of them throws.
 */
export type * from './circuit.js';
export type * from './result.js';
export type { Program } from './ast.js';
export type { Token, TokenKind } from './lexer.js';
export { MEASURES, STATEMENT_KEYWORDS, parse } from './parser.js';
export { lex } from './lexer.js';
export { compile } from './compile.js';
export { analyze } from './analyze.js';
export { FIRST_EXAMPLE } from './examples.js';
export { toCsv, toJson } from './output.js';
export { SI_PREFIXES, UNIT_SPELLINGS, formatSi, parseSi } from './units.js';
