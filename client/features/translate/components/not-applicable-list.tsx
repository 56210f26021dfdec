import type { NotApplicable } from "../../../../common/convert.ts";

/**
 * Theories this bound says nothing about, each with the reason in words. Under an amplitude bound most
 * entries are phase-only (code different_channel): they are named once, folded, instead of one line each.
 */
export function NotApplicableList({ items }: { items: readonly NotApplicable[] }) {
  if (items.length === 0) return null;
  const otherChannel = items.filter((n) => n.code === "different_channel");
  const listed = items.filter((n) => n.code !== "different_channel");
  return (
    <section aria-labelledby="not-applicable-title" className="flex flex-col gap-2">
      <h3 id="not-applicable-title" className="text-lg">
        Not constrained by this bound
      </h3>
      <ul className="flex flex-col gap-1 text-sm" data-testid="not-applicable">
        {listed.map((n) => (
          <li key={n.theory} data-theory={n.theory} data-code={n.code}>
            <span className="font-semibold">{n.theory_name}</span>
            {n.b.length > 0 && <span className="text-ink-faint"> (b = {n.b.join(", ")})</span>}: <span className="text-ink-soft">{n.reason}</span>
          </li>
        ))}
      </ul>
      {otherChannel.length > 0 && (
        <details className="text-sm" data-testid="not-applicable-channel">
          <summary className="cursor-pointer text-ink-soft">
            {otherChannel.length} {otherChannel.length === 1 ? "entry maps" : "entries map"} the phase or the ringdown only: an amplitude bound says nothing about{" "}
            {otherChannel.length === 1 ? "it" : "them"}
          </summary>
          <ul className="mt-1 flex flex-col gap-1">
            {otherChannel.map((n) => (
              <li key={n.theory} data-theory={n.theory} data-code={n.code}>
                <span className="font-semibold">{n.theory_name}</span>
                {n.b.length > 0 && <span className="text-ink-faint"> (b = {n.b.join(", ")})</span>}
              </li>
            ))}
          </ul>
        </details>
      )}
    </section>
  );
}
