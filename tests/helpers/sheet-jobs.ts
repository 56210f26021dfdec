import request from "supertest";
import { expect } from "vitest";
import type { DragomanApp } from "../../server/app.ts";
import { submitSamples, waitForJob } from "./jobs.ts";
import { filled, gaussian, rng, toCsv } from "./samples-data.ts";

/**
 * Finished jobs of every kind a sheet can hold, run by a worker in the test process on invented
 * posteriors: two EdGB samples jobs (b = -7, a fixed 10 + 5 and 8 + 3 solar-mass binary), their stack, and
 * a consistency job on two Gaussian remnant posteriors.
 */
export const SAMPLES_SETTINGS = { theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, frame: "source", columns: { deviation: "beta", m1: "m1", m2: "m2" } };

function remnantTable(M0: number, c0: number, sM: number, sc: number, n: number, seed: number): string {
  const u = rng(seed);
  const normal = () => Math.sqrt(-2 * Math.log(u() || 1e-12)) * Math.cos(2 * Math.PI * u());
  const rows = ["M_f,chi_f"];
  for (let i = 0; i < n; i += 1) rows.push(`${(M0 + sM * normal()).toFixed(5)},${(c0 + sc * normal()).toFixed(6)}`);
  return rows.join("\n");
}

async function finished(app: DragomanApp, res: request.Response): Promise<string> {
  expect(res.status, JSON.stringify(res.body).slice(0, 400)).toBe(202);
  const id = res.body.job.id as string;
  const view = await waitForJob(app, id);
  expect(view.status, JSON.stringify(view.error ?? {})).toBe("done");
  return id;
}

export async function samplesJob(app: DragomanApp, opts: { name?: string; m1?: number; m2?: number; sd?: number; seed?: number; n?: number } = {}): Promise<string> {
  const { name = "kv-a.csv", m1 = 10, m2 = 5, sd = 2e-3, seed = 11, n = 5000 } = opts;
  return finished(app, await submitSamples(app, toCsv({ beta: gaussian(seed, n, 0, sd), m1: filled(n, m1), m2: filled(n, m2) }), name, SAMPLES_SETTINGS));
}

export async function stackJob(app: DragomanApp, a: string, b: string): Promise<string> {
  const body = { theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, prior: { kind: "uniform" }, include_outside_validity: true, events: [{ label: "KV-A", job: a }, { label: "KV-B", job: b }] };
  return finished(app, await request(app).post("/api/v1/jobs/stack").send(body));
}

export async function consistencyJob(app: DragomanApp): Promise<string> {
  let r = request(app).post("/api/v1/jobs/consistency").field("request", JSON.stringify({ frame: "detector" }));
  r = r.attach("inspiral", Buffer.from(remnantTable(62, 0.68, 2, 0.03, 4000, 11)), "kv-inspiral.csv");
  r = r.attach("merger_ringdown", Buffer.from(remnantTable(66, 0.72, 2.5, 0.04, 4000, 29)), "kv-ringdown.csv");
  return finished(app, await r);
}

/** Two Gaussian remnant estimates (invented) for POST /consistency and a consistency record. */
export const GAUSSIAN_SUMMARIES = {
  inspiral: { M_f: 62, chi_f: 0.68, sigma_M_f: 2, sigma_chi_f: 0.03, rho: 0.1 },
  merger_ringdown: { M_f: 66, chi_f: 0.72, sigma_M_f: 2.5, sigma_chi_f: 0.04 },
  frame: "detector",
};
