/**
 * Places text labels on a plot so that they overlap neither each other nor what is drawn: a
 * greedy placement over candidate positions (each label takes its first candidate that is free,
 * in the caller's order of preference; when none is, the one that overlaps least), in pixels of
 * the plot's frame. Text is measured by an estimate (common practice: an average glyph of a
 * proportional sans-serif is about 0.55 em wide; 0.6 em is used to stay on the safe side), since
 * the server has no fonts to measure with.
 */

/** A box in pixels: left, top, width, height. */
export interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

/** Average glyph width and line height, in em (see above). */
const GLYPH_EM = 0.6;
const LINE_EM = 1.2;

/** The box of a line of text centred on (cx, cy) in a font of `fontPx` pixels. */
export function textBox(text: string, cx: number, cy: number, fontPx = 12): Box {
  const width = [...text].length * GLYPH_EM * fontPx;
  const height = LINE_EM * fontPx;
  return { x: cx - width / 2, y: cy - height / 2, width, height };
}

/** The area two boxes share (0 when they do not overlap). */
export function overlapArea(a: Box, b: Box): number {
  const w = Math.min(a.x + a.width, b.x + b.width) - Math.max(a.x, b.x);
  const h = Math.min(a.y + a.height, b.y + b.height) - Math.max(a.y, b.y);
  return w > 0 && h > 0 ? w * h : 0;
}

/** The area of `a` outside `frame`. */
function outside(a: Box, frame: Box): number {
  const w = Math.max(0, Math.min(a.x + a.width, frame.x + frame.width) - Math.max(a.x, frame.x));
  const h = Math.max(0, Math.min(a.y + a.height, frame.y + frame.height) - Math.max(a.y, frame.y));
  const area = a.width * a.height - w * h;
  return area > 1e-6 ? area : 0; // no rounding residue for a box inside the frame
}

/** A label to place: its text and the centres it may take, best first (pixels). */
export interface LabelRequest {
  text: string;
  candidates: { cx: number; cy: number }[];
}

/** Where a label went: its centre and box, and whether it found a free place. */
export interface PlacedLabel {
  text: string;
  cx: number;
  cy: number;
  box: Box;
  free: boolean;
}

/**
 * Places the labels in order; each placed label is an obstacle for the next ones.
 * @param requests - labels with candidate centres, best first
 * @param obstacles - boxes of what is drawn (points, line segments, fixed labels)
 * @param frame - the plotting area the labels must stay inside
 * @param gapPx - free space kept around each label (default 2)
 * @example placeLabels([{ text: 'coil', candidates: [{ cx: 300, cy: 120 }] }], [], { x: 0, y: 0, width: 640, height: 360 })
 */
export function placeLabels(requests: readonly LabelRequest[], obstacles: readonly Box[], frame: Box, fontPx = 12, gapPx = 2): PlacedLabel[] {
  const taken: Box[] = [...obstacles];
  const placed: PlacedLabel[] = [];
  for (const r of requests) {
    let best: PlacedLabel | null = null;
    let bestCost = Infinity;
    for (const c of r.candidates) {
      const box = textBox(r.text, c.cx, c.cy, fontPx);
      const padded = { x: box.x - gapPx, y: box.y - gapPx, width: box.width + 2 * gapPx, height: box.height + 2 * gapPx };
      // outside the frame weighs more than an overlap: a label cut off at the edge is lost
      const cost = 10 * outside(box, frame) + taken.reduce((sum, o) => sum + overlapArea(padded, o), 0);
      if (cost < bestCost) {
        bestCost = cost;
        best = { text: r.text, cx: c.cx, cy: c.cy, box, free: cost === 0 };
        if (cost === 0) break;
      }
    }
    if (!best) continue;
    placed.push(best);
    taken.push(best.box);
  }
  return placed;
}
