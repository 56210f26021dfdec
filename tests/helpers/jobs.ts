import request from "supertest";
import { expect } from "vitest";
import { jobViewSchema, type JobView } from "../../common/jobs.ts";
import type { DragomanApp } from "../../server/app.ts";

/** Polls GET /api/v1/jobs/:id until `done(view)` (no timing assertion: the test timeout bounds it). */
export async function waitForJob(app: DragomanApp, id: string, done: (v: JobView) => boolean = (v) => ["done", "failed", "cancelled"].includes(v.status)): Promise<JobView> {
  for (;;) {
    const res = await request(app).get(`/api/v1/jobs/${id}`);
    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(200);
    const view = jobViewSchema.parse(res.body);
    if (done(view)) return view;
    await new Promise((r) => setTimeout(r, 100));
  }
}

export async function submitSamples(app: DragomanApp, file: Buffer | string, name: string, settings: object): Promise<request.Response> {
  return request(app)
    .post("/api/v1/jobs/samples")
    .field("request", JSON.stringify(settings))
    .attach("file", Buffer.isBuffer(file) ? file : Buffer.from(file), name);
}
