import type { NotApplicable } from "../../../../common/convert.ts";

/** Theories this bound says nothing about, each with the reason in words. */
export function NotApplicableList({ items }: { items: readonly NotApplicable[] }) {
  if (items.length === 0) return null;
  return (
    <section aria-labelledby="not-applicable-title" className="flex flex-col gap-2">
      <h3 id="not-applicable-title" className="text-lg">
        Not constrained by this bound
      </h3>
      <ul className="flex flex-col gap-1 text-sm" data-testid="not-applicable">
        {items.map((n) => (
          <li key={n.theory} data-theory={n.theory} data-code={n.code}>
            <span className="font-semibold">{n.theory_name}</span>
            {n.b.length > 0 && <span className="text-ink-faint"> (b = {n.b.join(", ")})</span>}: <span className="text-ink-soft">{n.reason}</span>
          </li>
        ))}
      </ul>
    </section>
  );
}
