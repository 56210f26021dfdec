import type { Request } from "express";
import { z } from "zod";
import { dbId } from "../../../common/ids.ts";
import {
  commentListResponseSchema,
  commentSchema,
  createCommentSchema,
  createSubmissionSchema,
  decisionSchema,
  statusResponseSchema,
  submissionDetailSchema,
  submissionListQuerySchema,
  submissionListResponseSchema,
  submissionSavedSchema,
  updateSubmissionSchema,
} from "../../../common/catalogue.ts";
import { UnauthorizedError } from "../../errors.ts";
import { access, parseWith, type RouteSpec } from "../../http/route.ts";
import type { SubmissionsService } from "./service.ts";

const idParams = z.object({ id: dbId("submission id") });
const writers = access.roles("contributor", "editor");

function who(req: Request) {
  // The access guard has run; this only narrows the type.
  if (!req.identity) throw new UnauthorizedError();
  return req.identity;
}

const idOf = (req: Request) => parseWith(idParams, req.params, "path").id;

/** Proposing entries and changes, and reviewing them. */
export function submissionsRoutes(service: SubmissionsService): RouteSpec[] {
  return [
    {
      method: "post",
      path: "/v1/submissions",
      access: writers,
      summary: "Save a new draft proposing an entry (or, with target_slug, a change to one); the engine checks it at once",
      tags: ["submissions"],
      body: createSubmissionSchema,
      response: submissionSavedSchema,
      errors: [400, 401, 403, 409],
      handler: async (req, res) => {
        const body = parseWith(createSubmissionSchema, req.body);
        res.status(201).json(await service.create(who(req), body));
      },
    },
    {
      method: "get",
      path: "/v1/submissions",
      access: writers,
      summary: "Submissions: contributors see their own, editors everyone's (mine=1 for one's own; status=a,b to filter)",
      tags: ["submissions"],
      query: submissionListQuerySchema,
      response: submissionListResponseSchema,
      errors: [400, 401, 403],
      handler: async (req, res) => {
        const q = parseWith(submissionListQuerySchema, req.query, "query");
        res.json({ submissions: await service.list(who(req), q) });
      },
    },
    {
      method: "get",
      path: "/v1/submissions/:id",
      access: writers,
      summary: "One submission (its author or an editor): the entry, its checks, and a diff against the theory it changes",
      tags: ["submissions"],
      response: submissionDetailSchema,
      errors: [401, 403, 404],
      handler: async (req, res) => {
        res.json(await service.get(idOf(req), who(req)));
      },
    },
    {
      method: "patch",
      path: "/v1/submissions/:id",
      access: writers,
      summary: "Save a new version (author: draft or returned; editor: submitted, resubmitted or in review); 409 when `version` is stale",
      tags: ["submissions"],
      body: updateSubmissionSchema,
      response: submissionSavedSchema,
      errors: [400, 401, 403, 404, 409],
      handler: async (req, res) => {
        const id = idOf(req);
        const body = parseWith(updateSubmissionSchema, req.body);
        res.json(await service.update(id, who(req), body));
      },
    },
    {
      method: "post",
      path: "/v1/submissions/:id/submit",
      access: writers,
      summary: "Send a draft (or a returned submission) to the editors; they get an e-mail",
      tags: ["submissions"],
      response: statusResponseSchema,
      errors: [401, 403, 404, 409],
      handler: async (req, res) => {
        res.json(await service.submit(idOf(req), who(req)));
      },
    },
    {
      method: "post",
      path: "/v1/submissions/:id/start-review",
      access: access.roles("editor"),
      summary: "Take a submitted or resubmitted submission into review",
      tags: ["submissions", "review"],
      response: statusResponseSchema,
      errors: [401, 403, 404, 409],
      handler: async (req, res) => {
        res.json(await service.startReview(idOf(req), who(req)));
      },
    },
    {
      method: "post",
      path: "/v1/submissions/:id/decision",
      access: access.roles("editor"),
      summary: "Accept (publishes the next revision) or return with a comment; the author gets an e-mail. Not on one's own submission (403); not while a check fails (409)",
      tags: ["submissions", "review"],
      body: decisionSchema,
      response: statusResponseSchema,
      errors: [400, 401, 403, 404, 409],
      handler: async (req, res) => {
        const id = idOf(req);
        const body = parseWith(decisionSchema, req.body);
        res.json(await service.decide(id, who(req), body));
      },
    },
    {
      method: "post",
      path: "/v1/submissions/:id/withdraw",
      access: writers,
      summary: "The author withdraws a draft, submitted or returned submission",
      tags: ["submissions"],
      response: statusResponseSchema,
      errors: [401, 403, 404, 409],
      handler: async (req, res) => {
        res.json(await service.withdraw(idOf(req), who(req)));
      },
    },
    {
      method: "get",
      path: "/v1/submissions/:id/comments",
      access: writers,
      summary: "The comment thread of a submission, oldest first (review decisions included)",
      tags: ["submissions", "review"],
      response: commentListResponseSchema,
      errors: [401, 403, 404],
      handler: async (req, res) => {
        res.json({ comments: await service.comments(idOf(req), who(req)) });
      },
    },
    {
      method: "post",
      path: "/v1/submissions/:id/comments",
      access: writers,
      summary: "Add a comment (the author or an editor)",
      tags: ["submissions", "review"],
      body: createCommentSchema,
      response: commentSchema,
      errors: [400, 401, 403, 404],
      handler: async (req, res) => {
        const id = idOf(req);
        const { body } = parseWith(createCommentSchema, req.body);
        res.status(201).json(await service.addComment(id, who(req), body));
      },
    },
  ];
}
