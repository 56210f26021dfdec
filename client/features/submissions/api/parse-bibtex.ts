import { useMutation } from "@tanstack/react-query";
import { parsedReferenceSchema } from "../../../../common/catalogue.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";

/** Reads one pasted BibTeX entry on the server (the same parser the export uses). */
export function useParseBibtex() {
  return useMutation({
    mutationFn: (bibtex: string) => apiRequest(apiPaths.parseBibtex(), parsedReferenceSchema, { method: "POST", body: { bibtex } }),
  });
}
