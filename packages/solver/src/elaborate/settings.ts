/** The cell's one-of-a-kind lines: sweep, time window, temperature and spread. */
import type { Circuit, SourceRange, SweepSpec, ToleranceSpec } from '../circuit.js';
import type { SpreadStatement, SweepStatement, TemperatureStatement, TimeStatement } from '../ast.js';
import { diagnostic } from '../diagnostic.js';
import { formatSi } from '../units.js';
import type { Elaboration } from './context.js';
import { bound, formatCount, integer, read, sourceText } from './values.js';
import type { Slot } from './values.js';

const MAX_DRAWS = 100_000;

/** The frequencies a `sweep` line asks for, or null (with the reason reported). */
export function sweepStatement(cx: Elaboration, st: SweepStatement): SweepSpec | null {
  const line = st.range.line;
  const hz: Slot = { says: 'a sweep’s frequencies are in Hz', units: ['Hz'], example: '10k' };
  if (st.form === 'list') {
    if (st.frequencies.length === 0) {
      cx.error(st.range, 'sweep-empty', 'this sweep lists no frequencies', 'write sweep at 1k, 2k, 5k');
      return null;
    }
    const fs: number[] = [];
    for (const v of st.frequencies) {
      const f = read(cx, cx.top, v, line, hz);
      if (f === null) return null;
      if (f < 0) {
        cx.error(
          v.range,
          'sweep-non-positive',
          `a sweep’s frequencies cannot be negative; this is ${formatSi(f, 'Hz')}`,
          'list frequencies of 0 Hz (the DC point) or above',
        );
        return null;
      }
      if (fs.length > 0 && f <= fs[fs.length - 1]) {
        cx.error(
          v.range,
          'sweep-order',
          f === fs[fs.length - 1]
            ? `${formatSi(f, 'Hz')} is listed twice`
            : `the frequencies of sweep at go up: ${formatSi(f, 'Hz')} comes after ${formatSi(fs[fs.length - 1], 'Hz')}`,
          'list them from low to high, each once',
        );
        return null;
      }
      fs.push(f);
    }
    if (fs.length > cx.maxPoints) {
      cx.error(st.range, 'sweep-too-many', `this sweep has ${fs.length.toLocaleString('en-US')} points; the limit is ${cx.maxPoints.toLocaleString('en-US')}`);
      return null;
    }
    if (fs[0] === 0) noteDcPoint(cx, st.range);
    return { kind: 'list', frequencies: fs };
  }
  const from = read(cx, cx.top, st.from, line, hz);
  const to = read(cx, cx.top, st.to, line, hz);
  if (from === null || to === null) return null;
  if (st.form === 'log') {
    if (from <= 0 || to <= 0) {
      const bad = from <= 0 ? st.from : st.to;
      cx.error(
        bad.range,
        'sweep-non-positive',
        `a log sweep cannot reach ${formatSi(from <= 0 ? from : to, 'Hz')}: its frequencies are above 0 Hz`,
        'start at a small positive frequency, like 1, or use a linear sweep: sweep 0 .. 10k, 101 linear',
      );
      return null;
    }
  } else if (from < 0 || to < 0) {
    const bad = from < 0 ? st.from : st.to;
    cx.error(bad.range, 'sweep-non-positive', 'a sweep’s frequencies cannot be negative', 'start at 0 or above');
    return null;
  }
  if (to < from) {
    cx.error(
      st.range,
      'sweep-reversed',
      `this sweep runs backwards, from ${formatSi(from, 'Hz')} down to ${formatSi(to, 'Hz')}`,
      'write the lower frequency first',
      {
        title: 'Swap the ends',
        replacement: `${sourceText(st.to)} .. ${sourceText(st.from)}`,
        range: { line, column: st.from.range.column, endColumn: st.to.range.endColumn },
      },
    );
    return null;
  }
  if (to === from) {
    cx.error(
      st.range,
      'sweep-empty',
      `this sweep starts and stops at ${formatSi(from, 'Hz')}, so it is empty`,
      `for one frequency write sweep at ${sourceText(st.from)}`,
    );
    return null;
  }
  if (st.form === 'linear') {
    const points = integer(cx, cx.top, st.points, line, 'a linear sweep’s count of points', 2, Number.MAX_SAFE_INTEGER);
    if (points === null) return null;
    if (points > cx.maxPoints) {
      cx.error(
        st.points.range,
        'sweep-too-many',
        `this sweep has ${points.toLocaleString('en-US')} points; the limit is ${cx.maxPoints.toLocaleString('en-US')}`,
        'use fewer points',
      );
      return null;
    }
    if (from === 0) noteDcPoint(cx, st.range);
    return { kind: 'linear', from, to, points };
  }
  let perDecade = 100;
  if (st.perDecade !== null) {
    const n = read(cx, cx.top, st.perDecade, line, { says: 'points per decade is a plain count', units: [] });
    if (n === null) return null;
    if (!(n > 0)) {
      cx.error(st.perDecade.range, 'value-out-of-range', `points per decade must be more than 0; it is ${formatCount(n)}`);
      return null;
    }
    perDecade = n;
  }
  const points = Math.ceil(Math.log10(to / from) * perDecade - 1e-9) + 1;
  if (points > cx.maxPoints) {
    cx.error(
      st.perDecade?.range ?? st.range,
      'sweep-too-many',
      `this sweep has ${points.toLocaleString('en-US')} points; the limit is ${cx.maxPoints.toLocaleString('en-US')}`,
      'use fewer points per decade or a narrower range',
    );
    return null;
  }
  return { kind: 'log', from, to, perDecade };
}

/** A sweep with the 0 Hz point: solved, and in the results, but a log frequency axis cannot draw it. */
function noteDcPoint(cx: Elaboration, range: SourceRange): void {
  cx.diagnostics.push(
    diagnostic(range, 'dc-point', 'the 0 Hz point is solved, but the plot’s log frequency axis cannot show it', {
      severity: 'info',
      hint: 'its values are in the results and the readouts use it: the low-frequency gain is the gain at 0 Hz',
    }),
  );
}

/** The time window of a `time` line, for step traces. */
export function timeStatement(cx: Elaboration, st: TimeStatement): Circuit['time'] {
  const line = st.range.line;
  const s: Slot = { says: 'a time window is in s', units: ['s'], example: '10m' };
  const from = read(cx, cx.top, st.from, line, s);
  const to = read(cx, cx.top, st.to, line, s);
  if (from === null || to === null) return null;
  if (from < 0) {
    cx.error(st.from.range, 'time-window', 'a time window starts at 0 s or later', 'write time 0 .. 10m');
    return null;
  }
  if (to <= from) {
    cx.error(
      st.range,
      'time-window',
      to === from ? 'this time window is empty' : `this time window runs backwards, from ${formatSi(from, 's')} to ${formatSi(to, 's')}`,
      'write the earlier time first, like time 0 .. 10m',
    );
    return null;
  }
  let points: number | undefined;
  if (st.points !== null) {
    const n = integer(cx, cx.top, st.points, line, 'the count of time points', 2, cx.maxPoints);
    if (n === null) return null;
    points = n;
  }
  return points === undefined ? { from, to } : { from, to, points };
}

/** The temperature in K of a `temperature` line (checked, not computed yet). */
export function temperatureStatement(cx: Elaboration, st: TemperatureStatement): number | null {
  const t = read(cx, cx.top, st.value, st.range.line, {
    says: 'a temperature is in K or °C',
    units: ['K', '°C'],
    convert: (v, u) => (u === '°C' ? v + 273.15 : v),
    example: '25°C or 290 K',
  });
  if (t === null) return null;
  if (!bound(cx, st.value, t > 0, `a temperature is above absolute zero; this is ${formatSi(t, 'K')}`, 'write it in K (290 K) or °C (25°C)')) return null;
  cx.warn(
    st.range,
    'not-available',
    'the temperature is not available yet: it is for noise results, which a later version adds',
    'the line is checked but has no effect',
  );
  return t;
}

/** The draws or extremes of a `spread` line (checked, not computed yet). */
export function spreadStatement(cx: Elaboration, st: SpreadStatement): ToleranceSpec | null {
  const spec: ToleranceSpec = { kind: st.mode === 'draws' ? 'montecarlo' : 'worstcase', range: st.range };
  if (st.mode === 'draws') {
    if (st.draws === null) return null;
    const draws = integer(cx, cx.top, st.draws, st.range.line, 'the count of draws', 1, MAX_DRAWS);
    if (draws === null) return null;
    spec.draws = draws;
    if (st.seed !== null) {
      const seed = integer(cx, cx.top, st.seed, st.range.line, 'the seed', 0, Number.MAX_SAFE_INTEGER);
      if (seed === null) return null;
      spec.seed = seed;
    }
  }
  cx.warn(
    st.range,
    'not-available',
    'spreads are not available yet: this line is checked but does not change the results',
    'a later version adds random draws and the extremes of the tolerance box',
  );
  return spec;
}
