import type { Config } from "../../config.ts";
import { AppError, ValidationError } from "../../errors.ts";
import { computeRateLimit } from "../../http/compute-rate-limit.ts";
import { access, parseWith, type RouteSpec } from "../../http/route.ts";
import { ipKeyGenerator } from "express-rate-limit";
import type { Request } from "express";
import { DerivationError, expressionErrorToHttp } from "../../physics/checks/index.ts";
import { isExpressionError, type ExpressionError } from "../../physics/expr/errors.ts";
import type { CheckRunner } from "./check-runner.ts";
import { checkRequest, checkResponse, deriveRequest, deriveResponse } from "./schemas.ts";

/**
 * Input the guard refuses to read at all (too long, too deep, characters or syntax we never parse)
 * is a bad request; anything readable gets a 200 report in which each failed check says why.
 */
const UNUSABLE: readonly ExpressionError["code"][] = ["too_long", "too_deep", "too_large", "bad_character", "forbidden_syntax", "bad_input"];

/** An expression is at most 2000 characters; 512 KiB leaves room for 50 definitions and a derivation, and for the guard to name what is too long. */
const EXPRESSION_BODY_LIMIT = 524_288;

/** Whose work it is, for fair use of the check workers: the account when signed in, else the address. */
export function checkClient(req: Request): string {
  return req.identity ? `user:${req.identity.id}` : `ip:${ipKeyGenerator(req.ip ?? "unknown")}`;
}

const DECLARATION_CODES = new Set<ExpressionError["code"]>(["bad_declaration", "bad_definition", "definition_cycle"]);

function toAppError(err: ExpressionError, field: string): AppError {
  const { body } = expressionErrorToHttp(err, field);
  return new AppError(400, body.error.code, body.error.message, { ...body.error.fields }, { ...body.error.detail });
}

export function expressionRoutes(config: Config, checks: CheckRunner): RouteSpec[] {
  const limiter = computeRateLimit(config, "expression");
  return [
    {
      method: "post",
      path: "/v1/expressions/check",
      access: access.public,
      summary: "Check one mapping or validity expression: parse, symbols, dimension, GR limit, PN order, derivation",
      tags: ["engine"],
      body: checkRequest,
      response: checkResponse,
      errors: [400, 429, 503],
      before: [limiter],
      bodyLimit: EXPRESSION_BODY_LIMIT,
      handler: async (req, res) => {
        const input = parseWith(checkRequest, req.body);
        try {
          // Guard, budget and checks all run in a check worker; unusable input comes back as an error.
          const report = await checks.mapping(checkClient(req), input, UNUSABLE);
          res.json(report);
        } catch (err) {
          if (isExpressionError(err)) throw toAppError(err, err.definition !== undefined ? "definitions" : "expression");
          throw err;
        }
      },
    },
    {
      method: "post",
      path: "/v1/expressions/derive",
      access: access.public,
      summary: "Derive b and beta (and the amplitude term) from a change of the binding energy, the flux or the frequency drift",
      tags: ["engine"],
      body: deriveRequest,
      response: deriveResponse,
      errors: [400, 429, 503],
      before: [limiter],
      bodyLimit: EXPRESSION_BODY_LIMIT,
      handler: async (req, res) => {
        const input = parseWith(deriveRequest, req.body);
        try {
          const d = await checks.derive(checkClient(req), input, {
            couplings: input.couplings,
            definitions: input.definitions ?? [],
            ...(input.evaluate_at ? { evaluate_at: input.evaluate_at } : {}),
          });
          res.json({ terms: d.terms, ...(d.amplitude ? { amplitude: d.amplitude } : {}), steps: d.steps, notes: d.notes });
        } catch (err) {
          if (err instanceof DerivationError) throw new ValidationError(err.message, { [err.field]: err.message });
          if (isExpressionError(err) && DECLARATION_CODES.has(err.code)) throw toAppError(err, "definitions");
          if (isExpressionError(err)) {
            const field = (["energy", "flux", "frequency_drift", "propagation"] as const).find((f) => err.message.startsWith(f)) ?? "derivation";
            throw toAppError(err, `${field}.coefficient`);
          }
          throw err;
        }
      },
    },
  ];
}
