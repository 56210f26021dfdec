import { useCallback, useEffect, useMemo, useRef, useState, type RefObject } from "react";
import { figureSvg, type LegendEntry } from "../../lib/figure-svg.ts";
import { downloadSvg, svgOf, type PlotModule } from "../../lib/plot.ts";
import { downloadPng } from "../../lib/png.ts";
import { usePlotModule } from "../../lib/use-plot.ts";
import { Button } from "./button.tsx";

export type { LegendEntry } from "../../lib/figure-svg.ts";

/** Below this drawing width a plot is laid out for a phone: fewer ticks, tighter margins, the same font sizes. */
export const NARROW_PX = 560;

/** The smallest font size any plot uses on the page, in CSS pixels (plots are drawn at the width shown, never scaled down). */
export const MIN_FONT_PX = 11;

interface FigureText {
  title: string;
  /** The downloaded files are named after this (".svg" / ".png" added). */
  filename: string;
  testId: string;
  caption?: string | undefined;
  /** What each mark means; shown under the plot and written into the downloaded files. */
  legend?: readonly LegendEntry[] | undefined;
  /**
   * What a reader must know before trusting the plot. The page shows these beside the figure (its
   * caution box); the downloaded files carry them under the plot, each with a caution mark.
   */
  cautions?: readonly string[] | undefined;
  /** The width the plot is drawn at when the page has room, and the width of the downloaded files. */
  width: number;
}

export interface FigureProps extends FigureText {
  /** Draws the plot at a width in CSS pixels (an SVG, or an element holding one); undefined while loading. */
  draw: ((width: number) => Element) | undefined;
  /** A problem met before drawing (the plotting library did not load). */
  problem?: string | undefined;
}

/** The width of an element's content box, followed as it changes (undefined where it cannot be measured). */
function useContentWidth(ref: RefObject<HTMLElement | null>): number | undefined {
  const [width, setWidth] = useState<number | undefined>();
  useEffect(() => {
    const el = ref.current;
    if (!el || typeof ResizeObserver === "undefined") return;
    const observer = new ResizeObserver((entries) => {
      const w = entries[0]?.contentRect.width;
      if (w !== undefined && w > 0) setWidth(Math.floor(w));
    });
    observer.observe(el);
    return () => observer.disconnect();
  }, [ref]);
  return width;
}

/**
 * A plot with its title, legend and caption, and SVG / PNG downloads that carry all of them (and its
 * cautions), so a saved file says what it shows. On the page the plot is drawn at the width there is
 * room for, so its text keeps its size on a phone; the files are drawn at the full `width`.
 */
export function Figure({ draw, problem, title, filename, testId, caption, legend, cautions, width }: FigureProps) {
  const box = useRef<HTMLDivElement>(null);
  const host = useRef<HTMLDivElement>(null);
  const room = useContentWidth(box);
  const shownWidth = room === undefined ? width : Math.min(width, room);
  const [failure, setFailure] = useState<string | undefined>();
  const [overflowing, setOverflowing] = useState(false);

  const rendered = useMemo((): { node?: Element; error?: string } => {
    if (!draw) return {};
    try {
      return { node: draw(shownWidth) };
    } catch (e) {
      return { error: e instanceof Error ? e.message : String(e) };
    }
  }, [draw, shownWidth]);

  // Only attaching the built element to the page is an effect.
  useEffect(() => {
    const el = host.current;
    if (!el || !rendered.node) return;
    el.replaceChildren(rendered.node);
    // A plot wider than its box (every label kept at its size) scrolls: measured after each drawing, which follows every change of room.
    setOverflowing(el.scrollWidth > el.clientWidth + 1);
    return () => el.replaceChildren();
  }, [rendered]);

  const file = useCallback((): SVGSVGElement | null => {
    if (!draw) return null;
    const svg = svgOf(draw(width));
    return svg ? figureSvg(svg, { title, legend, caption, cautions }) : null;
  }, [draw, width, title, legend, caption, cautions]);

  const save = (kind: "svg" | "png") => {
    try {
      const f = file();
      if (!f) return;
      if (kind === "svg") downloadSvg(f, filename);
      else downloadPng(f, filename).catch((e: unknown) => setFailure(e instanceof Error ? e.message : String(e)));
    } catch (e) {
      setFailure(e instanceof Error ? e.message : String(e));
    }
  };

  const shownProblem = problem ?? rendered.error ?? failure;
  const drawn = rendered.node !== undefined;
  return (
    <figure className="flex min-w-0 flex-col gap-2 rounded border border-paper-edge bg-white/50 p-3" data-testid={testId}>
      <div className="flex flex-wrap items-baseline justify-between gap-x-3 gap-y-1">
        <figcaption className="font-semibold">{title}</figcaption>
        <div className="flex items-baseline gap-2">
          <span className="text-sm text-ink-soft">Download</span>
          <Button kind="secondary" onClick={() => save("svg")} disabled={!drawn} data-testid={`${testId}-svg`} aria-label={`Download “${title}” as SVG`}>
            SVG
          </Button>
          <Button kind="secondary" onClick={() => save("png")} disabled={!drawn} data-testid={`${testId}-png`} aria-label={`Download “${title}” as PNG`}>
            PNG
          </Button>
        </div>
      </div>
      {!draw && !shownProblem && <p className="text-sm text-ink-faint">Loading the plotting library…</p>}
      {shownProblem && <p className="text-sm text-brick">The plot could not be drawn: {shownProblem}</p>}
      <div ref={box} className="w-full min-w-0">
        {/* A plot wider than the room (many labels side by side) scrolls inside its box, never the page. */}
        <div
          ref={host}
          className="max-w-full overflow-x-auto"
          data-role="plot-host"
          data-drawn-width={rendered.node ? shownWidth : undefined}
          // While it scrolls, the box takes a tab stop and a name, so the arrow keys reach the rest of the plot.
          role={overflowing ? "region" : undefined}
          aria-label={overflowing ? `${title} (scrolls sideways)` : undefined}
          tabIndex={overflowing ? 0 : undefined}
        />
      </div>
      {legend && legend.length > 0 && (
        <ul className="flex flex-col gap-0.5 text-xs text-ink-soft" aria-label="Legend" data-testid={`${testId}-legend`}>
          {legend.map((entry) => (
            <li key={entry.label}>
              <span aria-hidden="true" className="mr-1.5 inline-block w-3 text-center font-bold" style={{ color: entry.color }}>
                {entry.mark}
              </span>
              {entry.label}
            </li>
          ))}
        </ul>
      )}
      {caption && <p className="text-xs text-ink-faint">{caption}</p>}
    </figure>
  );
}

interface PlotFigureProps extends FigureText {
  /** Builds the plot at a width once Observable Plot has loaded; called again when it changes. */
  build: (Plot: PlotModule, width: number) => Element;
}

/** A Figure drawn with Observable Plot, loaded on demand. */
export function PlotFigure({ build, ...text }: PlotFigureProps) {
  const { Plot, failure } = usePlotModule();
  const draw = useMemo(() => (Plot ? (w: number) => build(Plot, w) : undefined), [Plot, build]);
  return <Figure {...text} draw={draw} problem={failure} />;
}
