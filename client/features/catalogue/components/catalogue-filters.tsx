import { useEffect, useId, useRef, useState } from "react";
import { FAMILY_LABELS, THEORY_FAMILIES } from "../../../../common/catalogue.ts";
import { useDebouncedValue } from "../../../components/ui/use-debounced-value.ts";
import { Button } from "../../../components/ui/button.tsx";
import { signed } from "./format.ts";
import type { TheoryFilters } from "../api/get-theories.ts";

interface Props {
  filters: TheoryFilters;
  rawText: string;
  /** Values present in the whole catalogue, offered as choices. */
  bValues: number[];
  pnValues: number[];
  onChange: (patch: Partial<Record<"family" | "b" | "pn" | "q", string | undefined>>) => void;
}

const selectClass = "rounded border border-paper-edge bg-white/70 px-2 py-1.5 text-[0.95rem] focus:border-sea tabular-nums";

export function CatalogueFilters({ filters, rawText, bValues, pnValues, onChange }: Props) {
  const id = useId();
  const [text, setText] = useState(rawText);
  const settled = useDebouncedValue(text, 300);
  // Only the settled text reaches the URL (and the server), and only when the typing changed it: a
  // URL changed by back/forward navigation must not be overwritten by the previous search.
  const pushed = useRef(settled);
  useEffect(() => {
    if (pushed.current === settled) return;
    pushed.current = settled;
    onChange({ q: settled.trim() || undefined });
  }, [settled, onChange]);
  // Back/forward navigation changes the URL under us: follow it (state adjusted during render).
  const [seenRaw, setSeenRaw] = useState(rawText);
  if (seenRaw !== rawText) {
    setSeenRaw(rawText);
    if (text.trim() !== rawText.trim()) setText(rawText);
  }

  const active = filters.family !== undefined || filters.b !== undefined || filters.pn_order !== undefined || Boolean(filters.text);
  return (
    <form role="search" aria-label="Filter the catalogue" className="flex flex-wrap items-end gap-4" onSubmit={(e) => e.preventDefault()}>
      <div className="flex flex-col gap-1 grow min-w-56">
        <label htmlFor={`${id}-q`} className="text-sm font-semibold">
          Search
        </label>
        <input
          id={`${id}-q`}
          type="search"
          value={text}
          onChange={(e) => setText(e.target.value)}
          placeholder="name or coupling (α, λ_g, Ġ)…"
          className={`${selectClass} w-full`}
        />
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor={`${id}-family`} className="text-sm font-semibold">
          Family
        </label>
        <select id={`${id}-family`} className={selectClass} value={filters.family ?? ""} onChange={(e) => onChange({ family: e.target.value || undefined })}>
          <option value="">all families</option>
          {THEORY_FAMILIES.map((f) => (
            <option key={f} value={f}>
              {FAMILY_LABELS[f]}
            </option>
          ))}
        </select>
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor={`${id}-b`} className="text-sm font-semibold">
          ppE exponent <i>b</i>
        </label>
        <select id={`${id}-b`} className={selectClass} value={filters.b ?? ""} onChange={(e) => onChange({ b: e.target.value || undefined })}>
          <option value="">any b</option>
          {bValues.map((b) => (
            <option key={b} value={b}>
              b = {signed(b)}
            </option>
          ))}
        </select>
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor={`${id}-pn`} className="text-sm font-semibold">
          PN order
        </label>
        <select id={`${id}-pn`} className={selectClass} value={filters.pn_order ?? ""} onChange={(e) => onChange({ pn: e.target.value || undefined })}>
          <option value="">any order</option>
          {pnValues.map((n) => (
            <option key={n} value={n}>
              {signed(n)}PN
            </option>
          ))}
        </select>
      </div>
      {active && (
        <Button
          kind="quiet"
          onClick={() => {
            setText("");
            onChange({ family: undefined, b: undefined, pn: undefined, q: undefined });
          }}
        >
          Clear filters
        </Button>
      )}
    </form>
  );
}
