import { useId, useState } from "react";
import { symbolText } from "../../../../common/symbol-text.ts";
import type { StoredRetirement, TheoryDetail } from "../../../../common/catalogue.ts";
import { Badge } from "../../../components/ui/badge.tsx";
import { Button } from "../../../components/ui/button.tsx";
import { ErrorNote } from "../../../components/ui/states.tsx";
import { useRetirement } from "../api/retire-theory.ts";
import { shortDate } from "./format.ts";

/** The "retired" label with its reason on hover. */
export function RetiredBadge({ retired, className = "" }: { retired: NonNullable<StoredRetirement>; className?: string }) {
  return (
    <Badge tone="fail" className={className} title={`Retired ${shortDate(retired.at)}${retired.by ? ` by ${retired.by}` : ""}: ${retired.reason}`}>
      retired
    </Badge>
  );
}

/** Why and since when, in a sentence. */
export function RetiredNote({ retired, what }: { retired: NonNullable<StoredRetirement>; what: string }) {
  return (
    <p className="text-sm" data-testid="retired-note">
      <RetiredBadge retired={retired} className="mr-2" />
      {what} was retired on {shortDate(retired.at)}
      {retired.by ? ` by ${retired.by}` : ""}: {retired.reason}. It is kept here with its history but is not used in translations or forecasts.
    </p>
  );
}

type Target = "entry" | `coupling:${string}` | `mapping:${number}`;

function targetBody(target: Target): { coupling?: string; mapping?: number } {
  if (target.startsWith("coupling:")) return { coupling: target.slice("coupling:".length) };
  if (target.startsWith("mapping:")) return { mapping: Number(target.slice("mapping:".length)) };
  return {};
}

/** Editors' panel: retire the entry, a coupling or a mapping with a reason, or restore what is retired. */
export function RetirementPanel({ theory }: { theory: TheoryDetail }) {
  const mutation = useRetirement(theory.slug);
  const [target, setTarget] = useState<Target>("entry");
  const [reason, setReason] = useState("");
  const ids = { target: useId(), reason: useId() };
  const retiredThings: { target: Target; label: string }[] = [
    ...(theory.retired ? [{ target: "entry" as const, label: "the whole entry" }] : []),
    ...theory.couplings.flatMap((c) => (c.retired ? [{ target: `coupling:${c.symbol}` as const, label: `coupling ${symbolText(c.symbol, c.latex)}` }] : [])),
    ...theory.mappings.flatMap((m, i) =>
      m.retired && !theory.couplings.find((c) => c.symbol === m.coupling)?.retired ? [{ target: `mapping:${i}` as const, label: `mapping ${i + 1} (${m.kind.replace(/_/g, " ")}${m.b === null ? "" : `, b = ${m.b}`})` }] : [],
    ),
  ];
  const live: { target: Target; label: string }[] = theory.retired
    ? []
    : [
        { target: "entry", label: "the whole entry" },
        ...theory.couplings.filter((c) => !c.retired).map((c) => ({ target: `coupling:${c.symbol}` as const, label: `coupling ${symbolText(c.symbol, c.latex)} and its mappings` })),
        ...theory.mappings.flatMap((m, i) => (m.retired ? [] : [{ target: `mapping:${i}` as const, label: `mapping ${i + 1} (${m.kind.replace(/_/g, " ")}${m.b === null ? "" : `, b = ${m.b}`})` }])),
      ];
  return (
    <section aria-labelledby="retire-heading" className="mt-10 rounded border border-paper-edge p-4" data-testid="retirement-panel">
      <h2 id="retire-heading" className="text-xl mb-2">
        Retire or restore (editors)
      </h2>
      <p className="text-sm text-ink-soft max-w-prose mb-3">
        A retired entry, coupling or mapping leaves translations and forecasts and stays readable here with its reason. Each change is published as a
        new revision.
      </p>
      {retiredThings.length > 0 && (
        <ul className="mb-4 flex flex-col gap-2">
          {retiredThings.map((r) => (
            <li key={r.target} className="flex flex-wrap items-center gap-3">
              <span>Retired: {r.label}</span>
              <Button disabled={mutation.isPending} onClick={() => mutation.mutate({ action: "restore", body: targetBody(r.target) })}>
                Restore {r.label}
              </Button>
            </li>
          ))}
        </ul>
      )}
      {live.length > 0 && (
        <form
          className="flex flex-wrap items-end gap-3"
          onSubmit={(e) => {
            e.preventDefault();
            mutation.mutate({ action: "retire", body: { reason, ...targetBody(target) } }, { onSuccess: () => setReason("") });
          }}
        >
          <label htmlFor={ids.target} className="flex flex-col text-sm">
            What
            <select id={ids.target} className="mt-1 rounded border border-paper-edge bg-white px-2 py-1" value={target} onChange={(e) => setTarget(e.target.value as Target)}>
              {live.map((l) => (
                <option key={l.target} value={l.target}>
                  {l.label}
                </option>
              ))}
            </select>
          </label>
          <label htmlFor={ids.reason} className="flex grow flex-col text-sm">
            Reason (shown with the mark)
            <input id={ids.reason} required maxLength={1000} className="mt-1 rounded border border-paper-edge bg-white px-2 py-1" value={reason} onChange={(e) => setReason(e.target.value)} />
          </label>
          <Button type="submit" disabled={mutation.isPending || reason.trim() === ""}>
            Retire
          </Button>
        </form>
      )}
      {mutation.isError && (
        <div className="mt-3">
          <ErrorNote error={mutation.error} title="The change was not made." />
        </div>
      )}
    </section>
  );
}
