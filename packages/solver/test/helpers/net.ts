/**
 * A small builder of `Circuit` objects for tests that need what the cell language cannot
 * write (random networks, huge ladders) or that test the numerical core on its own.
 */
import type { Circuit, Element, Probe, RequirementSpec, SweepSpec, TraceKind, TraceSpec } from '../../src/circuit.js';

const R0 = { line: 1, column: 1, endColumn: 2 };

export class Net {
  private readonly names: string[] = ['gnd'];
  private readonly index = new Map<string, number>([['gnd', 0]]);
  readonly elements: Element[] = [];
  readonly traces: TraceSpec[] = [];
  readonly requirements: RequirementSpec[] = [];
  drive: Circuit['drive'] = null;
  sweep: SweepSpec | null = null;

  node(name: string): number {
    let k = this.index.get(name);
    if (k === undefined) {
      k = this.names.length;
      this.names.push(name);
      this.index.set(name, k);
    }
    return k;
  }

  R(name: string, a: string, b: string, value: number): this {
    this.elements.push({ kind: 'resistor', name, range: R0, a: this.node(a), b: this.node(b), value, noiseless: false });
    return this;
  }

  C(name: string, a: string, b: string, value: number, esr = 0, esl = 0): this {
    this.elements.push({ kind: 'capacitor', name, range: R0, a: this.node(a), b: this.node(b), value, esr, esl });
    return this;
  }

  L(name: string, a: string, b: string, value: number, dcr = 0): this {
    this.elements.push({ kind: 'inductor', name, range: R0, a: this.node(a), b: this.node(b), value, dcr });
    return this;
  }

  couple(l1: string, l2: string, k: number): this {
    this.elements.push({ kind: 'coupling', name: `K_${l1}_${l2}`, range: R0, l1, l2, k });
    return this;
  }

  opamp(name: string, p: string, n: string, o: string, opts: { gain?: number; gbw?: number; zout?: number } = {}): this {
    this.elements.push({
      kind: 'opamp',
      name,
      range: R0,
      p: this.node(p),
      n: this.node(n),
      o: this.node(o),
      zout: opts.zout ?? 0,
      gain: opts.gain,
      gbw: opts.gbw,
    });
    return this;
  }

  vcvs(name: string, op: string, on: string, cp: string, cn: string, gain: number): this {
    this.elements.push({ kind: 'vcvs', name, range: R0, op: this.node(op), on: this.node(on), cp: this.node(cp), cn: this.node(cn), gain });
    return this;
  }

  vccs(name: string, op: string, on: string, cp: string, cn: string, gm: number): this {
    this.elements.push({ kind: 'vccs', name, range: R0, op: this.node(op), on: this.node(on), cp: this.node(cp), cn: this.node(cn), gm });
    return this;
  }

  cccs(name: string, op: string, on: string, control: string, gain: number): this {
    this.elements.push({ kind: 'cccs', name, range: R0, op: this.node(op), on: this.node(on), control, gain });
    return this;
  }

  ccvs(name: string, op: string, on: string, control: string, rm: number): this {
    this.elements.push({ kind: 'ccvs', name, range: R0, op: this.node(op), on: this.node(on), control, rm });
    return this;
  }

  vdrive(p: string, n = 'gnd'): this {
    this.drive = { kind: 'voltage', p: this.node(p), n: this.node(n), amplitude: 1, phaseDeg: 0, range: R0 };
    return this;
  }

  idrive(p: string, n = 'gnd'): this {
    this.drive = { kind: 'current', p: this.node(p), n: this.node(n), amplitude: 1, phaseDeg: 0, range: R0 };
    return this;
  }

  show(label: string, probe: Probe, kind?: TraceKind): this {
    const k: TraceKind =
      kind ?? (probe.kind === 'impedance' ? 'impedance' : probe.kind === 'current' ? 'current' : this.drive?.kind === 'current' ? 'transimpedance' : 'ratio');
    const unit = k === 'impedance' || k === 'transimpedance' ? 'Ω' : k === 'current' ? 'A/V' : 'V/V';
    this.traces.push({ label, expr: label, kind: k, probe, unit, range: { line: 10 + this.traces.length, column: 1, endColumn: 5 } });
    return this;
  }

  /** `show NODE` (voltage to ground). */
  v(label: string, p: string, n = 'gnd', kind?: TraceKind): this {
    return this.show(label, { kind: 'voltage', p: this.node(p), n: this.node(n) }, kind);
  }

  z(label: string, p: string, n = 'gnd'): this {
    return this.show(label, { kind: 'impedance', p: this.node(p), n: this.node(n) });
  }

  i(label: string, element: string): this {
    return this.show(label, { kind: 'current', element });
  }

  log(from: number, to: number, perDecade = 100): this {
    this.sweep = { kind: 'log', from, to, perDecade };
    return this;
  }

  at(...frequencies: number[]): this {
    this.sweep = { kind: 'list', frequencies };
    return this;
  }

  require(spec: Omit<RequirementSpec, 'range' | 'text'> & { text?: string }): this {
    this.requirements.push({ range: { line: 100 + this.requirements.length, column: 1, endColumn: 8 }, text: spec.text ?? 'require', ...spec });
    return this;
  }

  build(): Circuit {
    return {
      nodeNames: [...this.names],
      elements: [...this.elements],
      drive: this.drive,
      traces: [...this.traces],
      sweep: this.sweep,
      requirements: [...this.requirements],
      tolerance: null,
      temperature: 300,
      time: null,
    };
  }
}

export const net = (): Net => new Net();

/** Relative difference |a − b| / |b|. */
export function rel(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}
