import type {
  ChecksReport,
  SubmissionComment,
  SubmissionDetail,
  SubmissionStatus,
  SubmissionSummary,
  TheoryEntry,
} from "../../../common/catalogue.ts";
import type { Knex } from "../../db/knex.ts";
import { ConflictError, ForbiddenError, NotFoundError, ValidationError } from "../../errors.ts";
import type { Identity } from "../../http/identity.ts";
import { enqueueMail } from "../../mail/queue.ts";
import { decisionMessage, submittedMessages, type MailSubmission } from "../../mail/templates.ts";
import { checkEntry, guardEntryExpressions } from "../catalogue/entry-checks.ts";
import type { CheckRunner } from "../expressions/check-runner.ts";
import { diffEntries } from "../catalogue/entry-diff.ts";
import { publishEntry } from "../catalogue/publish.ts";
import { findTheoryId } from "../catalogue/read-repository.ts";
import { latestRevisionEntryOf } from "../catalogue/revision-repository.ts";
import * as repo from "./repository.ts";
import { AUTHOR_EDITABLE, EDITOR_EDITABLE, illegalTransition, nextStatus } from "./state-machine.ts";

export interface SubmissionsDeps {
  db: Knex;
  /** Base URL for links in e-mail. */
  siteUrl: string;
  clock: () => Date;
  /** The check workers (guard, budget, checks all run off the main thread). */
  checks: CheckRunner;
  /** Called after a transaction that queued mail has committed. */
  mailQueued: () => void;
}

const isEditor = (who: Identity) => who.roles.includes("editor");

function summary(s: repo.SubmissionRecord): SubmissionSummary {
  return {
    id: s.id,
    status: s.status,
    version: s.version,
    target_slug: s.target_slug,
    slug: s.entry.slug,
    name: s.entry.name,
    author: { id: s.author.id, login: s.author.login, name: s.author.name },
    checks_ok: s.checks_ok,
    created_at: s.created_at.toISOString(),
    updated_at: s.updated_at.toISOString(),
    submitted_at: s.submitted_at?.toISOString() ?? null,
    decided_at: s.decided_at?.toISOString() ?? null,
    revision: s.published_revision,
  };
}

function mailSubject(s: repo.SubmissionRecord): MailSubmission {
  return { id: s.id, slug: s.entry.slug, name: s.entry.name, target_slug: s.target_slug, version: s.version };
}

/**
 * A check stopped by its time limit has not vouched for anything: the version cannot be accepted
 * until a save runs the checks again and they finish.
 */
function refuseInconclusive(s: repo.SubmissionRecord): void {
  const open = s.checks.results.filter((r) => r.severity === "inconclusive");
  if (open.length === 0) return;
  const list = open.map((r) => `${r.path} (${r.name})`).join(", ");
  throw new ConflictError(
    `Submission #${s.id} cannot be accepted: ${open.length === 1 ? "one check is" : `${open.length} checks are`} inconclusive (they did not finish in their time limit): ${list}. Save the submission again to re-run the checks.`,
    { reason: "inconclusive_checks", inconclusive: open.map((r) => ({ path: r.path, name: r.name, message: r.message })) },
  );
}

export function submissionsService(deps: SubmissionsDeps) {
  const { db, siteUrl, clock } = deps;

  /** Authors see their own; editors see everyone's. Anyone else: 403 (the route already let them in by role). */
  const mayRead = (who: Identity, s: repo.SubmissionRecord) => s.author.id === who.id || isEditor(who);

  async function load(id: number, who: Identity): Promise<repo.SubmissionRecord> {
    const s = await repo.findSubmission(db, id);
    if (!s) throw new NotFoundError(`No submission #${id}.`);
    if (!mayRead(who, s)) throw new ForbiddenError(`Submission #${id} is not yours; only its author and editors may see it.`);
    return s;
  }

  /** Guard (400 for unusable expressions), slug rules, then the engine's checks: all before any lock is taken. */
  async function prepare(entry: TheoryEntry, targetSlug: string | null, who: Identity): Promise<ChecksReport> {
    // Fair use of the check workers is counted per account.
    const client = `user:${who.id}`;
    await guardEntryExpressions(entry, deps.checks, client);
    if (targetSlug !== null && entry.slug !== targetSlug) {
      throw new ValidationError(`Invalid request body: theory.slug: a change to "${targetSlug}" must keep its slug`, {
        "theory.slug": `must be "${targetSlug}", the slug of the theory this submission changes`,
      });
    }
    return checkEntry(entry, deps.checks, client, clock());
  }

  async function transition(
    id: number,
    who: Identity,
    action: "submit" | "start_review" | "withdraw",
    rule: (s: repo.SubmissionRecord) => void,
  ): Promise<{ record: repo.SubmissionRecord; status: SubmissionStatus; mailed: boolean }> {
    const now = clock();
    const result = await db.transaction(async (trx) => {
      const s = await repo.lockSubmission(trx, id);
      if (!s) throw new NotFoundError(`No submission #${id}.`);
      if (!mayRead(who, s)) throw new ForbiddenError(`Submission #${id} is not yours; only its author and editors may act on it.`);
      rule(s);
      const status = nextStatus(action, s.status);
      await repo.setStatus(trx, id, status, { updated_at: now, ...(action === "submit" ? { submitted_at: now } : {}) });
      await repo.recordEvent(trx, { submissionId: id, actorId: who.id, action, from: s.status, to: status, version: s.version, at: now });
      let mailed = false;
      if (action === "submit") {
        const editors = await repo.listEditors(trx);
        const returned = status === "resubmitted" ? await repo.lastReturn(trx, id) : undefined;
        const messages = submittedMessages(siteUrl, mailSubject(s), s.author, editors, status === "resubmitted" ? (returned?.version ?? s.version) : null);
        await enqueueMail(trx, messages);
        mailed = messages.length > 0;
      }
      return { record: s, status, mailed };
    });
    if (result.mailed) deps.mailQueued();
    return result;
  }

  const authorOnly = (who: Identity, verb: string) => (s: repo.SubmissionRecord) => {
    if (s.author.id !== who.id) throw new ForbiddenError(`Only the author (${s.author.login}) may ${verb} submission #${s.id}.`);
  };

  return {
    async create(who: Identity, body: { target_slug?: string | undefined; theory: TheoryEntry }) {
      const targetSlug = body.target_slug ?? null;
      let targetId: number | null = null;
      if (targetSlug !== null) {
        targetId = (await findTheoryId(db, targetSlug)) ?? null;
        if (targetId === null) throw new ValidationError(`Invalid request body: target_slug: no accepted theory "${targetSlug}"`, { target_slug: `no accepted theory has the slug "${targetSlug}"` });
      } else if (await findTheoryId(db, body.theory.slug)) {
        throw new ConflictError(`theory.slug: "${body.theory.slug}" is already in the catalogue; to change it, send target_slug "${body.theory.slug}".`, {
          field: "theory.slug",
          slug: body.theory.slug,
        });
      }
      const checks = await prepare(body.theory, targetSlug, who);
      const now = clock();
      const id = await db.transaction(async (trx) => {
        const newId = await repo.insertSubmission(trx, { authorId: who.id, targetTheoryId: targetId, entry: body.theory, checks, now });
        await repo.recordEvent(trx, { submissionId: newId, actorId: who.id, action: "create", from: null, to: "draft", version: 1, at: now });
        return newId;
      });
      return { id, status: "draft" as const, version: 1, checks };
    },

    async list(who: Identity, f: { mine?: boolean | undefined; status?: SubmissionStatus[] | undefined }): Promise<SubmissionSummary[]> {
      const ownOnly = f.mine === true || !isEditor(who);
      const rows = await repo.listSubmissions(db, { ...(ownOnly ? { authorId: who.id } : {}), ...(f.status ? { statuses: f.status } : {}) });
      return rows.map(summary);
    },

    async get(id: number, who: Identity): Promise<SubmissionDetail> {
      const s = await load(id, who);
      const current = s.target_theory_id === null ? undefined : await latestRevisionEntryOf(db, s.target_theory_id);
      const authors = await repo.listVersionAuthors(db, id, s.version);
      const returned = await repo.lastReturn(db, id);
      const returnedEntry = returned ? await repo.findVersionEntry(db, id, returned.version) : undefined;
      return {
        ...summary(s),
        theory: s.entry,
        checks: s.checks,
        target_revision: current?.number ?? null,
        diff: current ? diffEntries(current.entry, s.entry) : null,
        authors: authors.map(({ id: personId, login, name }) => ({ id: personId, login, name })),
        since_returned: returned
          ? {
              version: returned.version,
              returned_at: returned.at.toISOString(),
              returned_by: returned.by,
              diff: returnedEntry ? diffEntries(returnedEntry, s.entry) : null,
            }
          : null,
      };
    },

    async update(id: number, who: Identity, body: { version: number; theory: TheoryEntry }) {
      const before = await load(id, who);
      const checks = await prepare(body.theory, before.target_slug, who);
      const now = clock();
      return db.transaction(async (trx) => {
        const s = await repo.lockSubmission(trx, id);
        if (!s) throw new NotFoundError(`No submission #${id}.`);
        const asAuthor = s.author.id === who.id && AUTHOR_EDITABLE.includes(s.status);
        const asEditor = isEditor(who) && EDITOR_EDITABLE.includes(s.status);
        if (!asAuthor && !asEditor) {
          if (s.author.id !== who.id && !isEditor(who)) throw new ForbiddenError(`Only the author (${s.author.login}) or an editor may change submission #${id}.`);
          throw illegalTransition("save", s.status, s.author.id === who.id ? AUTHOR_EDITABLE : EDITOR_EDITABLE);
        }
        if (s.version !== body.version) {
          throw new ConflictError(
            `Submission #${id} was saved by someone else meanwhile: it is at version ${s.version}, you sent version ${body.version}. Reload version ${s.version}, reapply your change and save again.`,
            { current_version: s.version, your_version: body.version },
          );
        }
        const version = await repo.saveVersion(trx, id, body.version, body.theory, checks, now, who.id);
        if (version === undefined) throw new ConflictError(`Submission #${id} changed while saving; reload and try again.`, { your_version: body.version });
        await repo.recordEvent(trx, { submissionId: id, actorId: who.id, action: "save", from: s.status, to: s.status, version, at: now });
        return { id, status: s.status, version, checks };
      });
    },

    async submit(id: number, who: Identity) {
      const r = await transition(id, who, "submit", authorOnly(who, "submit"));
      return { id, status: r.status, version: r.record.version };
    },

    async startReview(id: number, who: Identity) {
      const r = await transition(id, who, "start_review", () => undefined);
      return { id, status: r.status, version: r.record.version };
    },

    async withdraw(id: number, who: Identity) {
      const r = await transition(id, who, "withdraw", authorOnly(who, "withdraw"));
      return { id, status: r.status, version: r.record.version };
    },

    async decide(id: number, who: Identity, body: { decision: "accept" | "return"; comment?: string | undefined }) {
      const now = clock();
      const out = await db.transaction(async (trx) => {
        const s = await repo.lockSubmission(trx, id);
        if (!s) throw new NotFoundError(`No submission #${id}.`);
        if (s.author.id === who.id) {
          throw new ForbiddenError(`You wrote submission #${id}; another editor must decide on it.`, { reason: "own_submission" });
        }
        const status = nextStatus(body.decision, s.status);
        let revision: number | null = null;
        if (body.decision === "accept") {
          refuseInconclusive(s);
          // Whoever wrote any version (an editor's fix included) is an author: acceptance needs an editor who wrote none.
          const authors = await repo.listVersionAuthors(trx, id, s.version);
          const mine = authors.find((a) => a.id === who.id);
          if (mine) {
            const which = mine.versions.length === 1 ? `version ${mine.versions[0]}` : `versions ${mine.versions.join(", ")}`;
            throw new ForbiddenError(
              `You edited submission #${id} (you wrote ${which}), so you are one of its authors; an editor who wrote no version of it must accept it.`,
              { reason: "edited_by_you", versions: mine.versions },
            );
          }
          const published = await publishEntry(trx, s.entry, s.checks, {
            targetSlug: s.target_slug,
            submissionId: s.id,
            authorId: s.author.id,
            authorIds: authors.map((a) => a.id),
            acceptedBy: who.id,
            now,
          });
          revision = published.revision;
        }
        await repo.setStatus(trx, id, status, { updated_at: now, decided_at: now, decided_by: who.id, ...(revision === null ? {} : { published_revision: revision }) });
        await repo.recordEvent(trx, { submissionId: id, actorId: who.id, action: body.decision, from: s.status, to: status, version: s.version, at: now });
        if (body.comment) await repo.insertComment(trx, { submissionId: id, authorId: who.id, kind: body.decision === "accept" ? "accepted" : "returned", body: body.comment, at: now });
        const editor = (await repo.findUser(trx, who.id)) ?? { id: who.id, login: who.login, name: who.name, email: null };
        const messages = decisionMessage(siteUrl, mailSubject(s), s.author, editor, body.decision, body.comment, revision);
        await enqueueMail(trx, messages);
        return { id, status, version: s.version, revision, mailed: messages.length > 0 };
      });
      if (out.mailed) deps.mailQueued();
      return { id: out.id, status: out.status, version: out.version, revision: out.revision };
    },

    async comments(id: number, who: Identity): Promise<SubmissionComment[]> {
      await load(id, who);
      return repo.listComments(db, id);
    },

    async addComment(id: number, who: Identity, body: string): Promise<SubmissionComment> {
      await load(id, who);
      const commentId = await repo.insertComment(db, { submissionId: id, authorId: who.id, kind: "comment", body, at: clock() });
      const all = await repo.listComments(db, id);
      const made = all.find((c) => c.id === commentId);
      if (!made) throw new Error("comment vanished after insert");
      return made;
    },
  };
}

export type SubmissionsService = ReturnType<typeof submissionsService>;
