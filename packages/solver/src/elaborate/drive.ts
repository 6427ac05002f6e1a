/** The `drive` line: where the network is driven, and how hard. */
import type { DriveStatement } from '../ast.js';
import type { Elaboration } from './context.js';
import { bound, read } from './values.js';

/** Reads the one `drive` line into `cx.drive`. */
export function driveStatement(cx: Elaboration, st: DriveStatement): void {
  if (cx.driveLine !== 0) {
    cx.error(
      st.range,
      'duplicate-drive',
      `a cell has one drive; there is one on line ${cx.driveLine} already`,
      'keep one drive line; show a different reference with show NODE / NODE',
    );
    return;
  }
  cx.driveLine = st.range.line;
  if (st.nodes.length < 1 || st.nodes.length > 2) return;
  const p = cx.node(cx.top, st.nodes[0], 'the drive', true);
  const n = st.nodes.length === 2 ? cx.node(cx.top, st.nodes[1], 'the drive', true) : 0;
  if (p === n) {
    cx.error(
      st.nodesRange,
      'bad-drive',
      p === 0 ? 'the drive cannot be applied to gnd' : `the drive’s two ends are the same node, ${st.nodes[0].name}`,
      'drive a node from gnd (drive in) or between two nodes (drive [p n])',
    );
    return;
  }
  const voltage = st.source === 'voltage';
  let amplitude = 1;
  if (st.amplitude !== null) {
    const a = read(
      cx,
      cx.top,
      st.amplitude,
      st.range.line,
      voltage
        ? { says: 'a voltage drive’s amplitude is in V', units: ['V'], example: '1' }
        : { says: 'a current drive’s amplitude is in A', units: ['A'], example: '1m' },
    );
    if (a === null) return;
    if (!bound(cx, st.amplitude, a !== 0, 'the drive’s amplitude cannot be 0', 'traces are per unit of drive; any amplitude other than 0 works')) return;
    amplitude = a;
  } else if (!voltage) {
    return;
  }
  let phaseDeg = 0;
  if (st.phase !== null) {
    const ph = read(cx, cx.top, st.phase, st.range.line, { says: 'a phase is in degrees', units: ['deg'], example: '90' });
    if (ph === null) return;
    phaseDeg = ph;
  }
  cx.drive = { kind: st.source, p, n, amplitude, phaseDeg, range: st.range };
}
