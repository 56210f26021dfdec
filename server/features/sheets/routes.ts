import type { Request, Response } from "express";
import { z } from "zod";
import { dbId } from "../../../common/ids.ts";
import {
  appendRecordSchema,
  createSheetSchema,
  exportQuerySchema,
  recordIdSchema,
  recordVersionQuerySchema,
  retranslationAcceptSchema,
  retranslationPreviewRequestSchema,
  retranslationPreviewSchema,
  sheetIdSchema,
  sheetListSchema,
  sheetSchema,
  shareResponseSchema,
  shareTokenSchema,
  updateSheetSchema,
} from "../../../common/sheets.ts";
import type { Config } from "../../config.ts";
import { UnauthorizedError } from "../../errors.ts";
import type { Identity } from "../../http/identity.ts";
import { access, parseWith, type RouteSpec } from "../../http/route.ts";
import { convertRateLimit } from "../convert/rate-limit.ts";
import type { ExportFile } from "./export-files.ts";
import type { SheetsService } from "./service.ts";

/** Saved sheets: analysts manage their own; a share token opens one read-only for anyone. */

const analyst = access.roles("analyst");
const idParams = z.object({ id: sheetIdSchema });
const tokenParams = z.object({ token: shareTokenSchema });
const recordParams = z.object({ id: sheetIdSchema, record: recordIdSchema });
const deleteQuery = z.strictObject({ version: dbId("version").optional() });

function caller(req: Request): Identity {
  if (!req.identity) throw new UnauthorizedError();
  return req.identity;
}

function sendFile(res: Response, file: ExportFile): void {
  res.setHeader("Content-Type", file.contentType);
  res.setHeader("Content-Disposition", `attachment; filename="${file.filename}"`);
  res.setHeader("Cache-Control", "no-store");
  res.send(file.body);
}

export function sheetsRoutes(service: SheetsService, config: Config): RouteSpec[] {
  const limit = convertRateLimit(config);
  const tags = ["sheets"];
  return [
    {
      method: "get",
      path: "/v1/sheets",
      access: analyst,
      summary: "Your saved sheets",
      tags,
      response: sheetListSchema,
      handler: async (req, res) => {
        res.json({ sheets: await service.list(caller(req)) });
      },
    },
    {
      method: "post",
      path: "/v1/sheets",
      access: analyst,
      // Each new record is translated (or its job read) as it is saved: it spends the translator's budget.
      before: [limit],
      summary: "Save a new sheet of records (translated bounds, samples, stacking and consistency results); each is computed once, as it is saved",
      tags,
      body: createSheetSchema,
      response: sheetSchema,
      errors: [400],
      handler: async (req, res) => {
        const input = parseWith(createSheetSchema, req.body);
        res.status(201).json(await service.create(caller(req), input));
      },
    },
    {
      method: "get",
      path: "/v1/sheets/:id",
      access: analyst,
      summary: "One of your sheets, with each record's stored translation",
      tags,
      response: sheetSchema,
      errors: [400, 404],
      handler: async (req, res) => {
        const { id } = parseWith(idParams, req.params, "path");
        res.json(await service.get(caller(req), id));
      },
    },
    {
      method: "patch",
      path: "/v1/sheets/:id",
      access: analyst,
      // Only new records are computed; { kind: "keep", id } keeps a stored record as it is.
      before: [limit],
      summary: 'Change a sheet\'s name, description or record list (give the version you read; a stale one answers 409). In records, { "kind": "keep", "id": n } keeps record n exactly as stored; any other item is a new record',
      tags,
      body: updateSheetSchema,
      response: sheetSchema,
      errors: [400, 404, 409],
      handler: async (req, res) => {
        const { id } = parseWith(idParams, req.params, "path");
        const input = parseWith(updateSheetSchema, req.body);
        res.json(await service.update(caller(req), id, input));
      },
    },
    {
      method: "post",
      path: "/v1/sheets/:id/records",
      access: analyst,
      before: [limit],
      summary: "Add one record to a sheet (a bound to translate, a finished samples, stacking or consistency job, or two Gaussian remnant estimates); the other records are not touched",
      tags,
      body: appendRecordSchema,
      response: sheetSchema,
      errors: [400, 404, 409],
      handler: async (req, res) => {
        const { id } = parseWith(idParams, req.params, "path");
        const input = parseWith(appendRecordSchema, req.body);
        res.status(201).json(await service.append(caller(req), id, input));
      },
    },
    {
      method: "delete",
      path: "/v1/sheets/:id/records/:record",
      access: analyst,
      summary: "Remove one record from a sheet (?version= is the version you read; a stale one answers 409)",
      tags,
      query: recordVersionQuerySchema,
      response: sheetSchema,
      errors: [400, 404, 409],
      handler: async (req, res) => {
        const { id, record } = parseWith(recordParams, req.params, "path");
        const { version } = parseWith(recordVersionQuerySchema, req.query, "query");
        res.json(await service.removeRecord(caller(req), id, record, version));
      },
    },
    {
      method: "post",
      path: "/v1/sheets/:id/retranslation/preview",
      access: analyst,
      before: [limit],
      summary: "Re-translate translation records against the current catalogue without saving: each limit old and new, verdict changes, the entries whose revision changed",
      tags,
      body: retranslationPreviewRequestSchema,
      response: retranslationPreviewSchema,
      errors: [400, 404, 409],
      handler: async (req, res) => {
        const { id } = parseWith(idParams, req.params, "path");
        const { records } = parseWith(retranslationPreviewRequestSchema, req.body);
        res.json(await service.previewRetranslation(caller(req), id, records));
      },
    },
    {
      method: "post",
      path: "/v1/sheets/:id/retranslation",
      access: analyst,
      before: [limit],
      summary: "Accept a previewed re-translation: the records take the new translation and keep the old one in their history (409 if the sheet or the catalogue moved since the preview)",
      tags,
      body: retranslationAcceptSchema,
      response: sheetSchema,
      errors: [400, 404, 409],
      handler: async (req, res) => {
        const { id } = parseWith(idParams, req.params, "path");
        const input = parseWith(retranslationAcceptSchema, req.body);
        res.json(await service.acceptRetranslation(caller(req), id, input));
      },
    },
    {
      method: "delete",
      path: "/v1/sheets/:id",
      access: analyst,
      summary: "Delete a sheet (optionally ?version=, answering 409 when it is stale)",
      tags,
      query: deleteQuery,
      errors: [400, 404, 409],
      handler: async (req, res) => {
        const { id } = parseWith(idParams, req.params, "path");
        const { version } = parseWith(deleteQuery, req.query, "query");
        await service.remove(caller(req), id, version);
        res.status(204).end();
      },
    },
    {
      method: "post",
      path: "/v1/sheets/:id/share",
      access: analyst,
      summary: "Issue a read-only share link for the sheet (a new one withdraws the previous link)",
      tags,
      response: shareResponseSchema,
      errors: [404],
      handler: async (req, res) => {
        const { id } = parseWith(idParams, req.params, "path");
        res.status(201).json(await service.share(caller(req), id));
      },
    },
    {
      method: "delete",
      path: "/v1/sheets/:id/share",
      access: analyst,
      summary: "Withdraw the sheet's share link",
      tags,
      errors: [404],
      handler: async (req, res) => {
        const { id } = parseWith(idParams, req.params, "path");
        await service.unshare(caller(req), id);
        res.status(204).end();
      },
    },
    {
      method: "get",
      path: "/v1/sheets/:id/export",
      access: analyst,
      summary: "Download a sheet as CSV, JSON, a LaTeX table (booktabs) or the BibTeX of every reference it cites",
      tags,
      query: exportQuerySchema,
      errors: [400, 404],
      handler: async (req, res) => {
        const { id } = parseWith(idParams, req.params, "path");
        const { format, digits } = parseWith(exportQuerySchema, req.query, "query");
        sendFile(res, await service.exportOwn(caller(req), id, format, digits));
      },
    },
    {
      method: "get",
      path: "/v1/shared/:token",
      access: access.public,
      summary: "A shared sheet, read-only, through its share token",
      tags,
      response: sheetSchema,
      errors: [400, 404, 429],
      before: [limit],
      handler: async (req, res) => {
        const { token } = parseWith(tokenParams, req.params, "path");
        res.json(await service.shared(token));
      },
    },
    {
      method: "get",
      path: "/v1/shared/:token/export",
      access: access.public,
      summary: "Download a shared sheet in one of the export formats",
      tags,
      query: exportQuerySchema,
      errors: [400, 404, 429],
      before: [limit],
      handler: async (req, res) => {
        const { token } = parseWith(tokenParams, req.params, "path");
        const { format, digits } = parseWith(exportQuerySchema, req.query, "query");
        sendFile(res, await service.exportShared(token, format, digits));
      },
    },
  ];
}
