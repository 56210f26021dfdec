// Entry of a check worker. The checks are TypeScript; the server runs under tsx, which a worker
// does not inherit, so the worker registers tsx's loader itself before importing them.
import { register } from "tsx/esm/api";

register();
await import("./check-worker-main.ts");
