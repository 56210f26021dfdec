/** "Demo: KV-231107a bounds" -> "demo-kv-231107a-bounds". */
export function fileStem(name: string): string {
  const stem = name
    .normalize("NFD")
    .replace(/[\u0300-\u036f]/g, "")
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 60);
  return stem || "sheet";
}
