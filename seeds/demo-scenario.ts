import type { TheoryEntry } from "../common/catalogue.ts";
import { parseConfig } from "../server/config.ts";
import type { Knex } from "../server/db/knex.ts";
import type { Identity, Role } from "../server/http/identity.ts";
import { catalogueService } from "../server/features/catalogue/service.ts";
import { submissionsService } from "../server/features/submissions/service.ts";
import { siteUrl } from "../server/mail/templates.ts";
import { inProcessCheckRunner } from "../server/features/expressions/check-runner.ts";
import type { SeedStep } from "./index.ts";

/**
 * An invented review scenario on top of the seeded catalogue, played through the same service the
 * API uses (so states, versions, events, comments and queued e-mails are all real):
 *   - demo-theorist proposes a change to EdGB, now in review with a short exchange of comments;
 *   - a fictional phenomenologist's change to the massive graviton was returned with comments;
 *   - a fictional postdoc's change to the noncommutative entry waits in the editors' queue;
 *   - demo-theorist has a draft for dCS whose new validity condition still fails a check;
 *   - the postdoc's change to Brans-Dicke was returned, revised and resubmitted, so a reviewer sees
 *     what changed since the returned version beside the change against the published revision.
 * The people, institutions and wording are fictional.
 */

const EXTRA_PEOPLE = [
  { login: "demo-phenomenologist", name: "Kasimir Oduya", email: "kasimir.oduya@demo.dragoman.invalid", roles: ["contributor"] as Role[] },
  { login: "demo-postdoc", name: "Lena Thornquist", email: "lena.thornquist@demo.dragoman.invalid", roles: ["contributor"] as Role[] },
];

async function identity(trx: Knex.Transaction, login: string): Promise<Identity> {
  const row = await trx("users").where({ login }).first<{ id: number; login: string; name: string; roles: Role[] } | undefined>("id", "login", "name", "roles");
  if (!row) throw new Error(`demo scenario: user ${login} is missing (the accounts seed step runs first)`);
  return { id: row.id, login: row.login, name: row.name, roles: row.roles, via: "session" };
}

/** Links in the seeded e-mails point at the configured site; a seed run without configuration uses the default address. */
function seedSiteUrl(): string {
  try {
    return siteUrl(parseConfig());
  } catch {
    return "http://127.0.0.1:3000";
  }
}

/** A clock that starts ten days ago and moves forward by the hours asked for. */
function scriptedClock(start: Date) {
  let t = start.getTime();
  return {
    now: () => new Date(t),
    advance: (hours: number) => {
      t += hours * 3_600_000;
    },
  };
}

export const demoScenarioSeed: SeedStep = {
  name: "demo-scenario",
  run: async (trx) => {
    for (const p of EXTRA_PEOPLE) await trx("users").insert(p);
    const clock = scriptedClock(new Date(Date.now() - 10 * 86_400_000));
    const service = submissionsService({ db: trx, siteUrl: seedSiteUrl(), clock: clock.now, checks: inProcessCheckRunner(), mailQueued: () => undefined });
    const catalogue = catalogueService(trx);
    const current = async (slug: string) => (await catalogue.revision(slug, 1)).entry as TheoryEntry;

    const theorist = await identity(trx, "demo-theorist");
    const editor = await identity(trx, "demo-editor");
    const admin = await identity(trx, "demo-admin");
    const phenomenologist = await identity(trx, "demo-phenomenologist");
    const postdoc = await identity(trx, "demo-postdoc");

    // 1. In review: demo-theorist sharpens the EdGB assumptions.
    const edgb = await current("edgb");
    const inReview = await service.create(theorist, {
      target_slug: "edgb",
      theory: {
        ...edgb,
        assumptions: [...edgb.assumptions, "scalar field starts at its asymptotic value well before the observed inspiral (no initial scalar hair dynamics)"],
      },
    });
    clock.advance(20);
    await service.submit(inReview.id, theorist);
    clock.advance(26);
    await service.startReview(inReview.id, editor);
    clock.advance(3);
    await service.addComment(inReview.id, editor, "Is the new assumption needed at leading PN order, or is it a statement about the initial data only? A sentence on why would help readers.");
    clock.advance(30);
    await service.addComment(inReview.id, theorist, "Only about initial data: transients decay before the band opens. I can move it into the summary if you prefer.");

    // 2. Returned: a detector-frame chirp mass slipped into the massive-graviton phase term.
    const graviton = await current("massive-graviton");
    const [first, ...rest] = graviton.mappings;
    if (!first) throw new Error("demo scenario: massive-graviton has no mapping");
    const returned = await service.create(phenomenologist, {
      target_slug: "massive-graviton",
      theory: { ...graviton, mappings: [{ ...first, expression: "-pi^2*D_0*Mc*(1+z)/lambda_g^2", latex: undefined, notes: "Uses the redshifted chirp mass." }, ...rest] },
    });
    clock.advance(5);
    await service.submit(returned.id, phenomenologist);
    clock.advance(40);
    await service.startReview(returned.id, admin);
    clock.advance(2);
    await service.decide(returned.id, admin, {
      decision: "return",
      comment:
        "The extra (1+z) counts the redshift twice: D_0 already carries it and the mapping takes source-frame masses (see the frame note). With detector-frame input the converter divides by (1+z) for you. Please restore Mc without the factor.",
    });
    clock.advance(9);
    await service.addComment(returned.id, phenomenologist, "Understood, I conflated Mc_z with Mc. Will revise.");

    // 3. Submitted, waiting in the queue: a clearer validity label for the noncommutative entry.
    const nc = await current("noncommutative");
    const queued = await service.create(postdoc, {
      target_slug: "noncommutative",
      theory: {
        ...nc,
        mappings: nc.mappings.map((m) => ({ ...m, validity: m.validity.map((v) => ({ ...v, label: `${v.label} (checked at the innermost stable circular orbit)` })) })),
      },
    });
    clock.advance(4);
    await service.submit(queued.id, postdoc);

    // 4. Draft: a slow-rotation condition for dCS, not yet finished.
    const dcs = await current("dcs");
    clock.advance(6);
    await service.create(theorist, {
      target_slug: "dcs",
      theory: {
        ...dcs,
        mappings: dcs.mappings.map((m) => ({
          ...m,
          validity: [...m.validity, { expression: "abs(chi1) + abs(chi2)", max: 0.5, label: "slow rotation of both black holes (draft: threshold to be justified)", kind: "rule_of_thumb" }],
        })),
      },
    });

    // 5. Resubmitted: returned once for a missing range, revised, sent again.
    const bd = await current("brans-dicke");
    const resubmitted = await service.create(postdoc, {
      target_slug: "brans-dicke",
      theory: { ...bd, assumptions: [...bd.assumptions, "neutron-star sensitivities from a stiff equation of state"] },
    });
    clock.advance(3);
    await service.submit(resubmitted.id, postdoc);
    clock.advance(20);
    await service.startReview(resubmitted.id, admin);
    clock.advance(1);
    await service.decide(resubmitted.id, admin, {
      decision: "return",
      comment: "Which stiff equations of state, and what sensitivity range do they give for a 1.4 solar-mass star? State the range so readers can tell how much the bound depends on it.",
    });
    clock.advance(30);
    const revised = await service.update(resubmitted.id, postdoc, {
      version: 1,
      theory: {
        ...bd,
        assumptions: [...bd.assumptions, "neutron-star sensitivity between 0.1 and 0.3 for a 1.4 solar-mass star, the span of the stiff equations of state considered (an input; our own reading)"],
      },
    });
    clock.advance(1);
    await service.addComment(resubmitted.id, postdoc, `Version ${revised.version} states the sensitivity range instead of naming the equation of state.`);
    await service.submit(resubmitted.id, postdoc);
  },
};
