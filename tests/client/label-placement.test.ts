// @vitest-environment jsdom
import { describe, expect, it } from "vitest";
import { LEADER_AFTER_PX, placeLabels, roomNeeded } from "../../client/lib/label-placement.ts";
import { LABEL_GAP_PX, theoryLabelMark, theoryLabels, widthForLabels, type TheoryMark } from "../../client/components/ui/theory-labels.ts";

/**
 * Labels along one axis: no two closer than the gap, order kept, inside the frame, each as near its
 * own place as the others allow, and a leader line wherever a label stands off its place (common
 * practice for labelled vertical rules).
 */
function expectSound(desired: number[], gap: number, lo: number, hi: number) {
  const { labels, fits } = placeLabels(desired, gap, lo, hi);
  expect(fits).toBe(true);
  expect(labels).toHaveLength(desired.length);
  for (let i = 1; i < labels.length; i++) expect(labels[i]!.at - labels[i - 1]!.at).toBeGreaterThanOrEqual(gap - 1e-9);
  for (const l of labels) {
    expect(l.at).toBeGreaterThanOrEqual(lo - 1e-9);
    expect(l.at).toBeLessThanOrEqual(hi + 1e-9);
    // A label off its place has a leader; one beside its place has none.
    expect(l.leader).toBe(Math.abs(l.at - l.own) > LEADER_AFTER_PX);
  }
  return labels;
}

describe("placing labels beside their lines", () => {
  it("when labels are already a gap apart, then each stays exactly on its line, without a leader", () => {
    const labels = expectSound([80, 120, 300, 313], 13, 64, 740);
    expect(labels.map((l) => l.at)).toEqual([80, 120, 300, 313]);
    expect(labels.some((l) => l.leader)).toBe(false);
  });

  it("when many theories share one b, then they fan out symmetrically around it, the middle one on the line", () => {
    const labels = expectSound([400, 400, 400, 400, 400], 13, 64, 740);
    expect(labels.map((l) => l.at)).toEqual([374, 387, 400, 413, 426]);
    expect(labels[2]!.leader).toBe(false);
    expect(labels[0]!.leader && labels[4]!.leader).toBe(true);
  });

  it("when a crowd sits beside a lone label, then the crowd spreads without pushing the loner off its line more than needed", () => {
    // The case the old spreader got wrong: a run of labels at one b pushed its neighbour one whole b
    // (about 35 px here) away with no leader.
    const desired = [200, 200, 200, 200, 200, 200, 235, 400];
    const labels = expectSound(desired, 13, 64, 740);
    // Least squares with order kept: the mean displacement of a crowded run is zero where the frame allows.
    const run = labels.slice(0, 7);
    const shift = run.reduce((sum, l, i) => sum + (l.at - desired[i]!), 0);
    expect(Math.abs(shift)).toBeLessThan(1e-6);
    expect(labels[7]!.at).toBe(400);
    expect(labels[6]!.leader).toBe(true);
  });

  it("when a crowd stands at the frame's edge, then it is held inside the frame, order kept, leaders drawn", () => {
    const left = expectSound([64, 64, 65, 66, 70], 13, 64, 740);
    expect(left[0]!.at).toBe(64);
    const right = expectSound([700, 738, 740, 740, 740, 740], 13, 64, 740);
    expect(right[right.length - 1]!.at).toBe(740);
    expect(right[0]!.at).toBeLessThanOrEqual(700);
  });

  it("when labels come in a thoroughly crowded, random pattern, then none overlaps and every displaced label has a leader", () => {
    let seed = 11;
    const rand = () => {
      seed = (seed * 16807) % 2147483647;
      return seed / 2147483647;
    };
    for (let trial = 0; trial < 50; trial++) {
      const n = 2 + Math.floor(rand() * 40);
      const desired = Array.from({ length: n }, () => 64 + Math.round(rand() * 20) * 30).sort((a, b) => a - b);
      if (roomNeeded(n, 13) > 676) continue;
      expectSound(desired, 13, 64, 740);
    }
  });

  it("when the labels need more room than the frame has, then it says so and the plot is widened to hold them", () => {
    const crowded = Array.from({ length: 30 }, () => 150);
    expect(placeLabels(crowded, 13, 48, 300).fits).toBe(false);
    const width = widthForLabels(30, 48, 16);
    // The frame of a plot that wide (less half a gap at each end, as the label mark keeps) holds every label.
    expect(placeLabels(crowded, LABEL_GAP_PX, 48 + LABEL_GAP_PX / 2, width - 16 - LABEL_GAP_PX / 2).fits).toBe(true);
  });

  it("when the theory labels are drawn, then each stands on a stem, and a label moved off its b gets a slanted leader to it", () => {
    const marks: TheoryMark[] = [
      { b: -7, theory: "edgb", name: "EdGB", state: "outside_validity" },
      { b: -7, theory: "brans-dicke", name: "Brans-Dicke theory", state: "valid" },
      { b: -7, theory: "dark-photon", name: "Dark photon", state: "not_assessed" },
      { b: 2, theory: "massive-graviton", name: "Massive graviton", state: "valid" },
    ];
    const labels = theoryLabels(marks);
    // A linear b axis over [-8, 3] on a 300 px wide plot with 50 / 16 px margins.
    const x = (b: number) => 50 + ((b + 8) / 11) * 234;
    const render = theoryLabelMark(labels);
    const g = render([], { x } as never, {} as never, { width: 300, height: 300, marginTop: 196, marginRight: 16, marginBottom: 30, marginLeft: 50 }, {} as never)!;
    const texts = [...g.querySelectorAll('[data-role="theory-label"]')];
    expect(texts.map((t) => t.childNodes[0]?.textContent)).toEqual(["✓ Brans-Dicke theory", "✕ EdGB", "? Dark photon", "✓ Massive graviton"]);
    const lines = [...g.querySelectorAll("line")];
    expect(lines).toHaveLength(4);
    // Every line ends on the frame's top edge at its own b.
    expect(lines.map((l) => Number(l.getAttribute("x2")))).toEqual([x(-7), x(-7), x(-7), x(2)].map((v) => Number(String(v))));
    expect(lines.every((l) => Number(l.getAttribute("y2")) === 196)).toBe(true);
    // The three at b = -7 fan out: the outer two lean (leaders), the middle one and the lone one stand straight.
    expect(lines.map((l) => l.getAttribute("data-role"))).toEqual(["leader", "stem", "leader", "stem"]);
    const at = texts.map((t) => Number(/translate\(([-\d.]+),/.exec(t.getAttribute("transform") ?? "")?.[1]));
    for (let i = 1; i < at.length; i++) expect(at[i]! - at[i - 1]!).toBeGreaterThanOrEqual(LABEL_GAP_PX - 0.1);
  });
});
