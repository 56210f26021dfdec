import type { Config } from "../config.ts";
import type { QueuedMail } from "./queue.ts";

/** The plain-text messages the review process sends. Links point at the client's pages. */

export interface MailPerson {
  name: string;
  login: string;
  email: string | null;
}

export interface MailSubmission {
  id: number;
  slug: string;
  name: string;
  /** Slug of the accepted theory it changes, when it is a change. */
  target_slug: string | null;
  version: number;
}

/** Where links in messages point: PUBLIC_URL, else the address the server listens on. */
export function siteUrl(config: Config): string {
  return (config.PUBLIC_URL ?? `http://${config.HOST}:${config.PORT}`).replace(/\/+$/, "");
}

// Same routes as client/lib/paths.ts (review, editSubmission); the server does not import client code.
const reviewPath = (id: number) => `/review/${id}`;
const editPath = (id: number) => `/submit/${id}`;

function what(s: MailSubmission): string {
  return s.target_slug ? `a change to "${s.name}" (${s.target_slug})` : `a new entry "${s.name}" (${s.slug})`;
}

/** To every editor (except the author): a submission is waiting for review. */
export function submittedMessages(
  site: string,
  s: MailSubmission,
  author: MailPerson,
  editors: MailPerson[],
  /** The version an editor returned, when this is a resubmission; null for a first submission. */
  returnedVersion: number | null,
): QueuedMail[] {
  const resubmitted = returnedVersion !== null;
  const verb = resubmitted ? "resubmitted" : "submitted";
  return editors
    .filter((e) => e.email && e.login !== author.login)
    .map((e) => ({
      to: e.email as string,
      topic: "submission.submitted",
      subject: `[Dragoman] Submission #${s.id} ${verb}: ${s.name}`,
      text: [
        `Hello ${e.name},`,
        "",
        `${author.name} (${author.login}) has ${verb} ${what(s)} for review (submission #${s.id}, version ${s.version}).`,
        resubmitted
          ? `It was returned at version ${returnedVersion}. The review page shows what changed since that version beside the changes against the published revision, and the comment thread says why.`
          : "",
        "",
        `Review it here: ${site}${reviewPath(s.id)}`,
        "",
        "You receive this because you are an editor of the Dragoman catalogue.",
      ]
        .filter((line, i, all) => !(line === "" && all[i - 1] === ""))
        .join("\n"),
    }));
}

/** To the author: the editor accepted or returned the submission, with the editor's comment. */
export function decisionMessage(
  site: string,
  s: MailSubmission,
  author: MailPerson,
  editor: MailPerson,
  decision: "accept" | "return",
  comment: string | undefined,
  revision: number | null,
): QueuedMail[] {
  if (!author.email) return [];
  const accepted = decision === "accept";
  const lines = [
    `Hello ${author.name},`,
    "",
    accepted
      ? `${editor.name} accepted your submission #${s.id} (${what(s)}). It is published as revision ${revision ?? "?"} of ${s.slug}.`
      : `${editor.name} returned your submission #${s.id} (${what(s)}) with comments. Revise it and submit it again when ready.`,
    "",
  ];
  if (comment) lines.push("Comment from the editor:", "", ...comment.split("\n").map((l) => `  ${l}`), "");
  lines.push(accepted ? `See the entry: ${site}/catalogue/${encodeURIComponent(s.slug)}` : `Revise it here: ${site}${editPath(s.id)}`);
  return [
    {
      to: author.email,
      topic: "submission.decided",
      subject: `[Dragoman] Submission #${s.id} ${accepted ? "accepted" : "returned"}: ${s.name}`,
      text: lines.join("\n"),
    },
  ];
}
