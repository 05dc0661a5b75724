// The dataset card's contact sheet: for a few recorded episodes (the first of each split, at
// most SHEET_EPISODES), the first and the last recorded frame drawn as springs, from above
// (x across, z down the page, looking down the −y axis) and from the side (x across, y up).
// Only the frames and the drawn springs of those few episodes are kept, read from their
// episode files at the end of the run, so the sheet costs nothing per episode of the sweep.
import type { EdgePanel } from '../../plots/svg-edge-sheet.ts';
import { renderEdgeSheet } from '../../plots/svg-edge-sheet.ts';
import type { NamedArray } from '../formats/named-array.ts';
import { formatLabelNumber } from './text-histogram.ts';

/** Episodes on the sheet at most. */
export const SHEET_EPISODES = 4;

/** Edge relations drawn: structural (chains) and cell edges (lattices); diagonals would hide the shape. */
const DRAWN_RELATIONS = new Set([0, 2]);

const START_COLOUR = '#7a8a99';

export interface SheetEpisode {
  id: string;
  split: string;
  startTimeS: number;
  endTimeS: number;
  /** Node positions (x, y, z per node) of the first and the last recorded frame, m. */
  start: Float64Array;
  end: Float64Array;
  /** Node pairs of the drawn springs, flat. */
  edges: Int32Array;
}

function arrayNamed(arrays: readonly NamedArray[], name: string): NamedArray | undefined {
  return arrays.find((a) => a.name === name);
}

/** The sheet's view of one episode from its arrays (as decoded from its NPZ file). */
export function sheetEpisode(id: string, split: string, arrays: readonly NamedArray[]): SheetEpisode | null {
  const positions = arrayNamed(arrays, 'positions');
  const edges = arrayNamed(arrays, 'edges');
  const time = arrayNamed(arrays, 'time');
  if (!positions || !edges || !time || positions.shape.length !== 3 || positions.shape[0] < 1) return null;
  const frames = positions.shape[0];
  const frameValues = positions.shape[1] * 3;
  const data = positions.data as ArrayLike<number>;
  const start = Float64Array.from({ length: frameValues }, (_, i) => data[i]);
  const end = Float64Array.from({ length: frameValues }, (_, i) => data[(frames - 1) * frameValues + i]);
  const relation = arrayNamed(arrays, 'edge_relation')?.data as ArrayLike<number> | undefined;
  const pairs = edges.data as ArrayLike<number>;
  const edgeCount = edges.shape[0];
  const kept: number[] = [];
  for (let e = 0; e < edgeCount; e++) if (relation === undefined || DRAWN_RELATIONS.has(relation[e])) kept.push(pairs[2 * e], pairs[2 * e + 1]);
  // A body with none of those relations is drawn with every spring.
  if (kept.length === 0) for (let i = 0; i < 2 * edgeCount; i++) kept.push(pairs[i]);
  const times = time.data as ArrayLike<number>;
  return { id, split, startTimeS: times[0], endTimeS: times[times.length - 1], start, end, edges: Int32Array.from(kept) };
}

/** Segments of the springs projected onto a plane: u from coordinate `uAxis`, v from `vAxis` times `vSign`. */
function projected(positions: Float64Array, edges: Int32Array, uAxis: number, vAxis: number, vSign: number): Float64Array {
  const segments = new Float64Array(2 * edges.length);
  for (let e = 0; e < edges.length / 2; e++) {
    const a = edges[2 * e] * 3;
    const b = edges[2 * e + 1] * 3;
    segments[4 * e] = positions[a + uAxis];
    segments[4 * e + 1] = vSign * positions[a + vAxis];
    segments[4 * e + 2] = positions[b + uAxis];
    segments[4 * e + 3] = vSign * positions[b + vAxis];
  }
  return segments;
}

/** The sheet document for the given episodes (at most SHEET_EPISODES are drawn). */
export function renderContactSheet(episodes: readonly SheetEpisode[], colourOf: (split: string) => string): string {
  return renderEdgeSheet({
    title: 'First and last recorded frame of a few episodes',
    note: 'From above: x across, z down the page. From the side: x across, y up. Chains: structural springs; lattices: cell edges.',
    rows: episodes.slice(0, SHEET_EPISODES).map((e) => {
      const colour = colourOf(e.split);
      const start = `t = ${formatLabelNumber(e.startTimeS)} s`;
      const end = `t = ${formatLabelNumber(e.endTimeS)} s`;
      const panels: EdgePanel[] = [
        { title: `${start}, from above`, view: 'above', segments: projected(e.start, e.edges, 0, 2, -1), colour: START_COLOUR },
        { title: `${end}, from above`, view: 'above', segments: projected(e.end, e.edges, 0, 2, -1), colour },
        { title: `${start}, from the side`, view: 'side', segments: projected(e.start, e.edges, 0, 1, 1), colour: START_COLOUR },
        { title: `${end}, from the side`, view: 'side', segments: projected(e.end, e.edges, 0, 1, 1), colour },
      ];
      return { label: `${e.id}, split "${e.split}"`, panels };
    }),
  });
}
