// Shared by bench/stall.bench.ts and its attacking client bench/stall-attacker.ts.

/** The audit's body size (refused with 413 before it is read) and the largest the in-request route accepts. */
export const SAMPLES = 200_000;
export const ACCEPTED_SAMPLES = 20_000;

/** One POST; its answer (status, or the client error) is counted under "<path> <status>". */
export async function post(url: string, path: string, body: string, counts: Map<string, number>): Promise<void> {
  try {
    const res = await fetch(`${url}${path}`, { method: "POST", headers: { "content-type": "application/json" }, body });
    await res.arrayBuffer();
    const key = `${path} ${res.status}`;
    counts.set(key, (counts.get(key) ?? 0) + 1);
  } catch (err) {
    const key = `${path} error ${err instanceof Error ? err.message : String(err)}`;
    counts.set(key, (counts.get(key) ?? 0) + 1);
  }
}

