import { z } from "zod";
import { theorySlugSchema } from "../../../common/convert.ts";
import { dbId } from "../../../common/ids.ts";
import {
  revisionDetailSchema,
  revisionListResponseSchema,
  theoryDetailSchema,
  theoryListQuerySchema,
  theoryListResponseSchema,
} from "../../../common/catalogue.ts";
import { access, parseWith, type RouteSpec } from "../../http/route.ts";
import type { ReferencesService } from "../references/service.ts";
import type { CatalogueService } from "./service.ts";

const slugParams = z.object({ slug: theorySlugSchema });
const revisionParams = slugParams.extend({ n: dbId("revision number") });
export const bibtexText = z.string().meta({ description: "BibTeX entries", "x-content-type": "application/x-bibtex" });

/** The accepted catalogue: public reading. */
export function catalogueRoutes(catalogue: CatalogueService, references: ReferencesService): RouteSpec[] {
  return [
    {
      method: "get",
      path: "/v1/theories",
      access: access.public,
      summary: "Accepted theories, filtered by family, ppE exponent b, PN order, mapping kind or text",
      tags: ["catalogue"],
      query: theoryListQuerySchema,
      response: theoryListResponseSchema,
      errors: [400],
      handler: async (req, res) => {
        const q = parseWith(theoryListQuerySchema, req.query, "query");
        res.json({ theories: await catalogue.list(q) });
      },
    },
    {
      method: "get",
      path: "/v1/theories/:slug",
      access: access.public,
      summary: "One accepted entry in full: couplings and conventions, definitions, mappings with checks and validity, references, reference bounds",
      tags: ["catalogue"],
      response: theoryDetailSchema,
      errors: [404],
      handler: async (req, res) => {
        const { slug } = parseWith(slugParams, req.params, "path");
        res.json(await catalogue.detail(slug));
      },
    },
    {
      method: "get",
      path: "/v1/theories/:slug/revisions",
      access: access.public,
      summary: "Every published revision of a theory, newest first",
      tags: ["catalogue"],
      response: revisionListResponseSchema,
      errors: [404],
      handler: async (req, res) => {
        const { slug } = parseWith(slugParams, req.params, "path");
        res.json(await catalogue.revisions(slug));
      },
    },
    {
      method: "get",
      path: "/v1/theories/:slug/revisions/:n",
      access: access.public,
      summary: "One revision: the entry as published, its checks, and its diff against the previous revision",
      tags: ["catalogue"],
      response: revisionDetailSchema,
      errors: [400, 404],
      handler: async (req, res) => {
        const { slug, n } = parseWith(revisionParams, req.params, "path");
        res.json(await catalogue.revision(slug, n));
      },
    },
    {
      method: "get",
      path: "/v1/theories/:slug/bibtex",
      access: access.public,
      summary: "BibTeX of every reference a theory cites",
      tags: ["catalogue", "references"],
      response: bibtexText,
      errors: [404],
      handler: async (req, res) => {
        const { slug } = parseWith(slugParams, req.params, "path");
        const text = await references.exportTheory(await catalogue.theoryIdOf(slug));
        res.type("application/x-bibtex; charset=utf-8").set("Content-Disposition", `inline; filename="${slug}.bib"`).send(text);
      },
    },
  ];
}
