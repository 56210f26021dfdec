import type { EntryDiff } from "../../../common/catalogue.ts";

type Json = null | boolean | number | string | Json[] | { [k: string]: Json };

/**
 * A structural diff of two entry documents, down to the leaves: each added, removed or changed path
 * ("mappings.0.expression") with its value before and after. Arrays compare position by position,
 * which is what a reviewer reads ("the second mapping's b changed"); an inserted element shows as
 * changes after it plus one addition at the end.
 */
export function diffEntries(before: unknown, after: unknown): EntryDiff {
  const diff: EntryDiff = { added: [], removed: [], changed: [] };
  walk(normalise(before), normalise(after), "", diff);
  return diff;
}

export function diffSize(diff: EntryDiff): number {
  return diff.added.length + diff.removed.length + diff.changed.length;
}

/** JSON round trip: drops undefined, so an absent optional field and an undefined one are the same. */
function normalise(value: unknown): Json | undefined {
  return value === undefined ? undefined : (JSON.parse(JSON.stringify(value)) as Json);
}

function isContainer(v: Json | undefined): v is Json[] | { [k: string]: Json } {
  return typeof v === "object" && v !== null;
}

function join(path: string, key: string | number): string {
  return path ? `${path}.${key}` : String(key);
}

function walk(a: Json | undefined, b: Json | undefined, path: string, diff: EntryDiff): void {
  if (a === undefined && b === undefined) return;
  if (a === undefined) {
    diff.added.push({ path: path || "(entry)", after: b });
    return;
  }
  if (b === undefined) {
    diff.removed.push({ path: path || "(entry)", before: a });
    return;
  }
  const bothArrays = Array.isArray(a) && Array.isArray(b);
  const bothObjects = isContainer(a) && isContainer(b) && !Array.isArray(a) && !Array.isArray(b);
  if (bothArrays) {
    const n = Math.max(a.length, b.length);
    for (let i = 0; i < n; i++) walk(a[i], b[i], join(path, i), diff);
    return;
  }
  if (bothObjects) {
    const keys = new Set([...Object.keys(a), ...Object.keys(b)]);
    for (const k of keys) walk(a[k], b[k], join(path, k), diff);
    return;
  }
  if (isContainer(a) || isContainer(b) || a !== b) diff.changed.push({ path: path || "(entry)", before: a, after: b });
}
