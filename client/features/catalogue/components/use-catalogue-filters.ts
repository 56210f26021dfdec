import { useCallback, useMemo } from "react";
import { useSearchParams } from "react-router-dom";
import { THEORY_FAMILIES, type TheoryFamily } from "../../../../common/catalogue.ts";
import type { TheoryFilters } from "../api/get-theories.ts";

const isFamily = (v: string | null): v is TheoryFamily => v !== null && (THEORY_FAMILIES as readonly string[]).includes(v);

function numberParam(v: string | null): number | undefined {
  if (v === null || v.trim() === "") return undefined;
  const n = Number(v);
  return Number.isFinite(n) ? n : undefined;
}

/**
 * The catalogue's filters live in the URL (?family=&b=&pn=&q=), so a filtered view can be shared,
 * bookmarked and restored with the back button. Unknown values are ignored rather than sent.
 */
export function useCatalogueFilters() {
  const [params, setParams] = useSearchParams();
  const familyParam = params.get("family");
  const bParam = params.get("b");
  const pnParam = params.get("pn");
  const qParam = params.get("q");

  const filters: TheoryFilters = useMemo(
    () => ({
      family: isFamily(familyParam) ? familyParam : undefined,
      b: numberParam(bParam),
      pn_order: numberParam(pnParam),
      text: qParam?.trim() ? qParam.trim() : undefined,
    }),
    [familyParam, bParam, pnParam, qParam],
  );

  const update = useCallback(
    (patch: Partial<Record<"family" | "b" | "pn" | "q", string | undefined>>) => {
      setParams(
        (prev) => {
          const next = new URLSearchParams(prev);
          for (const [k, v] of Object.entries(patch)) {
            if (v === undefined || v === "") next.delete(k);
            else next.set(k, v);
          }
          return next;
        },
        // Typing a search must not push one history entry per keystroke.
        { replace: true },
      );
    },
    [setParams],
  );

  return { filters, rawText: qParam ?? "", update };
}
