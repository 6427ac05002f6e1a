/**
 * The variants of a trace are drawn in shades of the trace's own colour: the first in the
 * colour itself, each next one a step nearer the panel's colour, the last `FARTHEST` of the
 * way, so they read as one family and stay apart from the other traces' colours.
 */

/** How far towards the panel the last variant's shade goes. */
const FARTHEST = 0.6;

function channels(colour: string): [number, number, number] | null {
  const hex = /^#([0-9a-f]{3}|[0-9a-f]{6})$/i.exec(colour.trim());
  if (hex === null) return null;
  const digits = hex[1].length === 3 ? [...hex[1]].map((d) => d + d).join('') : hex[1];
  return [0, 2, 4].map((i) => parseInt(digits.slice(i, i + 2), 16)) as [number, number, number];
}

/**
 * The shade of `colour` for variant `index` of `count`, mixed towards `panel` (both `#rrggbb`
 * or `#rgb`, as the palette writes them); a colour in any other form is used as it is.
 */
export function variantShade(colour: string, panel: string, index: number, count: number): string {
  const from = channels(colour);
  const to = channels(panel);
  if (from === null || to === null || count <= 1) return colour;
  const t = (FARTHEST * index) / (count - 1);
  return `#${from
    .map((c, i) =>
      Math.round(c + (to[i] - c) * t)
        .toString(16)
        .padStart(2, '0'),
    )
    .join('')}`;
}
