/**
 * Places labels along one axis (pixels) so neighbours stand at least `gap` apart, in their given order,
 * each as close to its own place as the others allow, inside [lo, hi]. A label that could not stay
 * beside its own place gets a leader line back to it (`leader`).
 *
 * Least squares with order kept is isotonic regression of `desired[i] - i·gap` (pool adjacent
 * violators); clipping that answer to the frame keeps it optimal (common practice for one-dimensional
 * label layouts). When the labels need more room than [lo, hi] holds (`fits` false), they are spread
 * evenly over the frame: the caller should widen the plot by `roomNeeded`.
 */
export interface PlacedLabel {
  /** Where the label stands. */
  at: number;
  /** Where it belongs (its line), clipped to the frame. */
  own: number;
  /** True when the label stands far enough from its line that a leader line must join them. */
  leader: boolean;
}

export interface Placement {
  labels: PlacedLabel[];
  fits: boolean;
}

/** Offsets up to this many pixels read as "beside its line": the label still touches it. */
export const LEADER_AFTER_PX = 3;

/** The frame length that n labels `gap` apart need. */
export function roomNeeded(n: number, gap: number): number {
  return Math.max(0, n - 1) * gap;
}

export function placeLabels(desired: readonly number[], gap: number, lo: number, hi: number): Placement {
  const n = desired.length;
  const own = desired.map((x) => Math.min(hi, Math.max(lo, x)));
  const fits = roomNeeded(n, gap) <= hi - lo + 1e-9;
  let at: number[];
  if (!fits) {
    const step = n > 1 ? (hi - lo) / (n - 1) : 0;
    at = own.map((_, i) => lo + i * step);
  } else {
    // Pool adjacent violators on y_i = desired_i - i·gap (must not decrease).
    const blocks: { sum: number; count: number }[] = [];
    own.forEach((x, i) => {
      blocks.push({ sum: x - i * gap, count: 1 });
      while (blocks.length > 1) {
        const last = blocks[blocks.length - 1]!;
        const prev = blocks[blocks.length - 2]!;
        if (prev.sum / prev.count <= last.sum / last.count) break;
        prev.sum += last.sum;
        prev.count += last.count;
        blocks.pop();
      }
    });
    const yMax = hi - roomNeeded(n, gap);
    at = [];
    for (const block of blocks) {
      const y = Math.min(yMax, Math.max(lo, block.sum / block.count));
      for (let k = 0; k < block.count; k++) at.push(y + at.length * gap);
    }
  }
  return { fits, labels: at.map((x, i) => ({ at: x, own: own[i]!, leader: Math.abs(x - own[i]!) > LEADER_AFTER_PX })) };
}
