/** compile() and parse() as the rest of Rolloff calls them. */
import { describe, expect, it } from 'vitest';
import { compile } from '../src/compile.js';
import { parse } from '../src/parser/index.js';
import { elaborate } from '../src/elaborate/index.js';

const RC = 'drive in\nR1 [in out] 1k\nC1 [out gnd] 1u\nshow out\n';

describe('parse', () => {
  it('gives one statement per line, each with its source range', () => {
    const { program, diagnostics } = parse(RC);
    expect(diagnostics).toEqual([]);
    expect(program.statements.map((s) => s.kind)).toEqual(['drive', 'passive', 'passive', 'show']);
    expect(program.statements[1].range).toEqual({ line: 2, column: 1, endColumn: 15 });
    expect(program.incomplete).toBe(false);
  });

  it('keeps the statements it could read when others fail', () => {
    const { program, diagnostics } = parse('drive in\nR1 [in out 1k\nC1 [out gnd] 1u\n');
    expect(diagnostics.map((d) => d.code)).toEqual(['unclosed-bracket']);
    expect(program.statements.map((s) => s.kind)).toEqual(['drive', 'passive']);
    expect(program.incomplete).toBe(true);
  });

  it('reads Windows and old Mac line ends', () => {
    expect(compile(RC.replace(/\n/g, '\r\n')).diagnostics).toEqual([]);
    expect(compile(RC.replace(/\n/g, '\r')).diagnostics).toEqual([]);
  });
});

describe('compile', () => {
  it('honours maxPoints', () => {
    const cell = RC + 'sweep 1 .. 1M, 100/decade\n';
    expect(compile(cell).circuit).not.toBeNull();
    const limited = compile(cell, { maxPoints: 500 });
    expect(limited.circuit).toBeNull();
    expect(limited.diagnostics.map((d) => d.message)).toEqual(['this sweep has 601 points; the limit is 500']);
    expect(elaborate(parse(cell).program, { maxPoints: 601 }).circuit).not.toBeNull();
  });

  it('honours maxParts', () => {
    const cell = 'block pair [i o]\n  R1 [i o] 1k\n  R2 [i o] 1k\nend\ndrive in\nuse pair as B1 [in out]\nuse pair as B2 [in out]\nR1 [out gnd] 1k\nshow out\n';
    expect(compile(cell, { maxParts: 5 }).circuit).not.toBeNull();
    const limited = compile(cell, { maxParts: 4 });
    expect(limited.circuit).toBeNull();
    expect(limited.diagnostics.map((d) => [d.code, d.message])).toEqual([
      ['network-too-large', 'the network has 5 parts after its blocks are expanded; the limit is 4'],
    ]);
  });

  it('returns a circuit with warnings, and none with an error', () => {
    const warned = compile(RC + 'spread extremes\n');
    expect(warned.circuit).not.toBeNull();
    expect(warned.diagnostics.map((d) => `${d.severity} ${d.code}`)).toEqual(['warning not-available']);
    const failed = compile(RC + 'R2 [out gnd] -1k\n');
    expect(failed.circuit).toBeNull();
    expect(failed.diagnostics.map((d) => `${d.severity} ${d.code}`)).toEqual(['error value-out-of-range']);
  });

  it('sorts diagnostics by place', () => {
    const { diagnostics } = compile('R1 [a b] 10meg\nshwo out\nR1 [b gnd] 1k\n');
    const places = diagnostics.map((d) => [d.line, d.column]);
    expect(places).toEqual([...places].sort((a, b) => a[0] - b[0] || a[1] - b[1]));
  });

  it('never throws, whatever it is handed', () => {
    expect(() => compile(undefined as unknown as string)).not.toThrow();
    expect(() => compile(42 as unknown as string)).not.toThrow();
    expect(() => parse(null as unknown as string)).not.toThrow();
  });

  // How fast is `npm run bench`'s business (case d); here only what it reports.
  it('reports a cell full of mistakes in full, and counts what it does not mark', () => {
    const lines = ['drive in'];
    for (let i = 0; i < 20000; i++) lines.push(`R${i} [in n${i}] 1k`);
    lines.push('show in');
    const dangling = compile(lines.join('\n'));
    expect(dangling.diagnostics).toHaveLength(101);
    expect(dangling.diagnostics.filter((d) => d.message === '19,900 more nodes connect to only one part')).toHaveLength(1);

    const params = [];
    for (let i = 0; i < 20000; i++) params.push(`let p${i} = 1`);
    for (let i = 0; i < 2000; i++) params.push(`R${i} [a b] q${i}`);
    const undefinedNames = compile(params.join('\n'));
    expect(undefinedNames.diagnostics.filter((d) => d.code === 'undefined-name')).toHaveLength(2000);
  }, 60_000);
});
