/**
 * Geometry of transition edges between step boxes, pure so it can be tested without a browser.
 *
 * Forward edges leave a step's right side for the next step's left side. Edges running backwards
 * (the exhale → inhale return of a breath cycle laid out left to right) pass underneath both boxes,
 * so they never cut through the steps between. Steps stacked vertically connect bottom to top.
 * Several edges between the same two steps fan out so their labels stay readable.
 */
export interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

export interface EdgeGeometry {
  path: string;
  labelX: number;
  labelY: number;
}

const FAN = 30; // px between parallel edges
const LOOP = 48; // px a return edge dips below the lower box

function cubicPoint(p0: number, p1: number, p2: number, p3: number, t: number): number {
  const u = 1 - t;
  return u * u * u * p0 + 3 * u * u * t * p1 + 3 * u * t * t * p2 + t * t * t * p3;
}

function cubic(
  a: [number, number],
  c1: [number, number],
  c2: [number, number],
  b: [number, number],
): EdgeGeometry {
  return {
    path: `M${a[0]},${a[1]} C${c1[0]},${c1[1]} ${c2[0]},${c2[1]} ${b[0]},${b[1]}`,
    labelX: cubicPoint(a[0], c1[0], c2[0], b[0], 0.5),
    labelY: cubicPoint(a[1], c1[1], c2[1], b[1], 0.5),
  };
}

/** Parallel vertical edges have labels at the same height: stack them one label-height apart. */
function stackLabel(g: EdgeGeometry, off: number): EdgeGeometry {
  return { ...g, labelY: g.labelY + off * 0.9 };
}

/** Offset of edge `index` of `count` around the middle: 0, then ±FAN… */
export function fanOffset(index: number, count: number): number {
  return (index - (count - 1) / 2) * FAN;
}

export function selfLoop(box: Box, index: number): EdgeGeometry {
  const lift = 46 + index * 22;
  const a: [number, number] = [box.x + box.width * 0.62, box.y];
  const b: [number, number] = [box.x + box.width * 0.38, box.y];
  return cubic(a, [a[0] + 30, a[1] - lift], [b[0] - 30, b[1] - lift], b);
}

export function edgeGeometry(source: Box, target: Box, index: number, count: number): EdgeGeometry {
  if (source === target || (source.x === target.x && source.y === target.y)) return selfLoop(source, index);
  const off = fanOffset(index, count);
  const sRight = source.x + source.width;
  const sMidY = source.y + source.height / 2;
  const tMidY = target.y + target.height / 2;
  const gap = 24;

  if (target.x >= sRight + gap) {
    // Forward. Ends shift a little apart; the middle spreads more so labels separate.
    const a: [number, number] = [sRight, sMidY + off * 0.3];
    const b: [number, number] = [target.x, tMidY + off * 0.3];
    const dx = Math.max(40, (b[0] - a[0]) / 2);
    return cubic(a, [a[0] + dx, a[1] + off * 1.1], [b[0] - dx, b[1] + off * 1.1], b);
  }
  if (source.x >= target.x + target.width + gap) {
    // Backward: under both boxes.
    const bottom = Math.max(source.y + source.height, target.y + target.height);
    const depth = bottom + LOOP + Math.abs(off) + index * 8;
    const a: [number, number] = [source.x + source.width / 2 + off * 0.5, source.y + source.height];
    const b: [number, number] = [target.x + target.width / 2 + off * 0.5, target.y + target.height];
    return cubic(a, [a[0], depth + (depth - a[1]) * 0.33], [b[0], depth + (depth - b[1]) * 0.33], b);
  }
  // Overlapping columns: the usual case of a top-to-bottom layout.
  const down = target.y > source.y;
  const rowGap = down ? target.y - (source.y + source.height) : source.y - (target.y + target.height);
  if (down && rowGap < source.height * 1.6) {
    // The next row: straight down, bottom to top.
    const a: [number, number] = [source.x + source.width / 2 + off, source.y + source.height];
    const b: [number, number] = [target.x + target.width / 2 + off, target.y];
    const dy = Math.max(30, (b[1] - a[1]) / 2);
    return stackLabel(cubic(a, [a[0], a[1] + dy], [b[0], b[1] - dy], b), off);
  }
  // Skipping rows (down) or returning (up): loop round the side so the curve never crosses the steps
  // in between — down on the left, back up on the right, as a cycle reads clockwise.
  const side = down ? -1 : 1;
  const span = Math.abs(tMidY - sMidY);
  const edgeX = side < 0 ? Math.min(source.x, target.x) : Math.max(source.x + source.width, target.x + target.width);
  // Parallel loops nest (signed offset) rather than share one track.
  const reach = edgeX + side * (LOOP + Math.min(120, span * 0.12) + FAN + off * 1.5);
  const a: [number, number] = [side < 0 ? source.x : source.x + source.width, sMidY + off * 0.3];
  const b: [number, number] = [side < 0 ? target.x : target.x + target.width, tMidY + off * 0.3];
  return stackLabel(cubic(a, [reach, a[1]], [reach, b[1]], b), off);
}
