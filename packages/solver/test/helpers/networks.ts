/** Random networks for the property tests of the numbers a designer signs. */
import fc from 'fast-check';

export const num = (x: number): string => x.toPrecision(17);
const TWO_PI = 2 * Math.PI;

export interface Network {
  /** The cell without its sweep and requirements. */
  body: string;
  /** Its resonance, Hz. */
  f0: number;
}

/** A series RLC read across R (band-pass), C (low-pass) or L (high-pass), Q from 0.3 to 300. */
export const network: fc.Arbitrary<Network> = fc
  .record({
    l: fc.double({ min: -4, max: -1, noNaN: true }),
    c: fc.double({ min: -9, max: -6, noNaN: true }),
    q: fc.double({ min: Math.log10(0.3), max: Math.log10(300), noNaN: true }),
    across: fc.constantFrom('R', 'C', 'L'),
  })
  .map(({ l, c, q, across }) => {
    const L = Math.pow(10, l);
    const C = Math.pow(10, c);
    const R = Math.sqrt(L / C) / Math.pow(10, q);
    const order = across === 'R' ? ['L', 'C', 'R'] : across === 'C' ? ['R', 'L', 'C'] : ['R', 'C', 'L'];
    const value: Record<string, number> = { R, L, C };
    const nodes = ['in', 'a', 'out', 'gnd'];
    const parts = order.map((kind, k) => `${kind}1 [${nodes[k]} ${nodes[k + 1]}] ${num(value[kind])}`);
    return { body: `drive in\n${parts.join('\n')}\nshow out\n`, f0: 1 / (TWO_PI * Math.sqrt(L * C)) };
  });
