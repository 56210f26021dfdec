import { bibtexExportQuerySchema, parseBibtexRequestSchema, parsedReferenceSchema, referenceListResponseSchema } from "../../../common/catalogue.ts";
import { access, parseWith, type RouteSpec } from "../../http/route.ts";
import { bibtexText } from "../catalogue/routes.ts";
import type { ReferencesService } from "./service.ts";

/** The literature: BibTeX import of one entry, export of any set. */
export function referencesRoutes(references: ReferencesService): RouteSpec[] {
  return [
    {
      method: "get",
      path: "/v1/references",
      access: access.public,
      summary: "Every paper the catalogue cites",
      tags: ["references"],
      response: referenceListResponseSchema,
      handler: async (_req, res) => {
        res.json({ references: await references.list() });
      },
    },
    {
      method: "post",
      path: "/v1/references/parse-bibtex",
      access: access.public,
      summary: "Reads one BibTeX entry into a reference (arXiv id and DOI format-checked); 400 names the field at fault",
      tags: ["references"],
      body: parseBibtexRequestSchema,
      response: parsedReferenceSchema,
      errors: [400],
      handler: (req, res) => {
        const { bibtex } = parseWith(parseBibtexRequestSchema, req.body);
        res.json(references.parseBibtex(bibtex));
      },
    },
    {
      method: "get",
      path: "/v1/references/bibtex",
      access: access.public,
      summary: "BibTeX of the references with the given ids (ids=1,2,3)",
      tags: ["references"],
      query: bibtexExportQuerySchema,
      response: bibtexText,
      errors: [400, 404],
      handler: async (req, res) => {
        const { ids } = parseWith(bibtexExportQuerySchema, req.query, "query");
        // Built before any header is set, so an error still answers in JSON.
        const text = await references.exportIds(ids);
        res.type("application/x-bibtex; charset=utf-8").set("Content-Disposition", 'inline; filename="references.bib"').send(text);
      },
    },
  ];
}
