// @vitest-environment jsdom
import { QueryClientProvider } from "@tanstack/react-query";
import { cleanup, fireEvent, render, screen, waitFor } from "@testing-library/react";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { SubmissionComments } from "../../client/features/submissions/components/submission-comments.tsx";
import { createQueryClient } from "../../client/lib/query-client.ts";

// An invented thread: the editor returned the submission; the author answers.
const returned = {
  id: 1,
  submission_id: 7,
  author: { id: 2, login: "demo-editor", name: "Tomasz Quell" },
  kind: "returned",
  body: "Please state the validity condition per black hole.",
  created_at: "2026-12-01T10:00:00.000Z",
};

let thread: unknown[] = [];
let posted: unknown[] = [];
beforeEach(() => {
  thread = [returned];
  posted = [];
  vi.stubGlobal(
    "fetch",
    vi.fn(async (url: string, init: RequestInit = {}) => {
      const json = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { "Content-Type": "application/json" } });
      if (init.method === "POST") {
        const body = JSON.parse(String(init.body)) as { body: string };
        posted.push({ url, body });
        const made = { ...returned, id: 2, kind: "comment", author: { id: 5, login: "demo-theorist", name: "Amara Venn" }, body: body.body };
        thread = [...thread, made];
        return json(201, made);
      }
      return json(200, { comments: thread });
    }),
  );
});
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe("SubmissionComments", () => {
  it("when the author answers a returned submission, then the answer is posted and appears in the thread", async () => {
    render(
      <QueryClientProvider client={createQueryClient()}>
        <SubmissionComments id={7} />
      </QueryClientProvider>,
    );
    await screen.findByText(/validity condition per black hole/);
    expect(screen.getByText("returned for changes")).toBeTruthy();
    const box = screen.getByLabelText("Answer the editors");
    fireEvent.change(box, { target: { value: "Added: 16 pi alpha^2/m_i^4 < 1/6 on each hole." } });
    fireEvent.click(screen.getByRole("button", { name: /Post answer/ }));
    await screen.findByText(/Added: 16 pi alpha/);
    expect(posted).toEqual([{ url: "/api/v1/submissions/7/comments", body: { body: "Added: 16 pi alpha^2/m_i^4 < 1/6 on each hole." } }]);
    await waitFor(() => expect((box as HTMLTextAreaElement).value).toBe(""));
  });
});
