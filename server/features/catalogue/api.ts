import type { Config } from "../../config.ts";
import type { Knex } from "../../db/knex.ts";
import type { RouteSpec } from "../../http/route.ts";
import { siteUrl } from "../../mail/templates.ts";
import type { CheckRunner } from "../expressions/check-runner.ts";
import { outboxRoutes } from "../outbox/routes.ts";
import { referencesRoutes } from "../references/routes.ts";
import { referencesService } from "../references/service.ts";
import { submissionsRoutes } from "../submissions/routes.ts";
import { submissionsService } from "../submissions/service.ts";
import { retirementService } from "./retire.ts";
import { retirementRoutes } from "./retire-routes.ts";
import { catalogueRoutes } from "./routes.ts";
import { catalogueService } from "./service.ts";

/** The catalogue, its references, the review process and the development outbox, wired for createApp. */
export function catalogueApiRoutes(deps: { db: Knex; config: Config; clock: () => Date; mailQueued: () => void; checks: CheckRunner }): RouteSpec[] {
  const { db } = deps;
  const references = referencesService(db);
  const submissions = submissionsService({ ...deps, siteUrl: siteUrl(deps.config) });
  return [...catalogueRoutes(catalogueService(db), references), ...referencesRoutes(references), ...submissionsRoutes(submissions), ...retirementRoutes(retirementService(db, deps.clock)), ...outboxRoutes(db)];
}
