import { useEffect, useRef, useState, type ReactNode, type RefObject } from "react";

/**
 * True while the element's content is wider than its box. A box that scrolls sideways must be
 * reachable by keyboard (arrow keys scroll it once it has focus), so scrolling boxes take a tab stop
 * and a name only while they actually scroll.
 */
export function useOverflowing(ref: RefObject<HTMLElement | null>): boolean {
  const [overflowing, setOverflowing] = useState(false);
  useEffect(() => {
    const el = ref.current;
    if (!el || typeof ResizeObserver === "undefined") return;
    const measure = () => setOverflowing(el.scrollWidth > el.clientWidth + 1);
    measure();
    const observer = new ResizeObserver(measure);
    observer.observe(el);
    for (const child of el.children) observer.observe(child);
    return () => observer.disconnect();
  }, [ref]);
  return overflowing;
}

interface Props {
  /** What the box holds, read out when it takes focus ("Limits on every applicable theory"). */
  label: string;
  className?: string;
  children: ReactNode;
  testId?: string;
}

/** A box that scrolls sideways inside the page (wide tables, long formulas), so the page itself never does. */
export function ScrollBox({ label, className = "", children, testId }: Props) {
  const ref = useRef<HTMLDivElement>(null);
  const overflowing = useOverflowing(ref);
  return (
    <div
      ref={ref}
      role={overflowing ? "region" : undefined}
      aria-label={overflowing ? label : undefined}
      tabIndex={overflowing ? 0 : undefined}
      data-testid={testId}
      className={`max-w-full overflow-x-auto ${className}`}
    >
      {children}
    </div>
  );
}
