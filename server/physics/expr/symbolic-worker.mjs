// @ts-check
// The symbolic worker thread (see pool.ts). Plain JavaScript on purpose: a fresh thread has no
// TypeScript loader, and registering one costs ~400 ms per cold start; as .mjs it starts in
// ~200 ms under tsx, vitest and plain node alike. Message shapes: symbolic-protocol.ts.
//
// Everything it receives was printed by our own AST printer from guarded input, with symbols
// renamed to neutral names, so nerdamer never sees ":=", prototype names or its own reserved
// words (e, i, gamma, ...).
import { parentPort, workerData } from "node:worker_threads";
import nerdamer from "nerdamer";
import "nerdamer/Algebra.js";
import "nerdamer/Calculus.js";
import "nerdamer/Solve.js";
import { lowerThisThread } from "../../threads/lower-priority.mjs";

/** @param {string} text */
const cas = (text) => nerdamer(text).toString();

/**
 * @param {import("./symbolic-protocol.ts").SymbolicRequest} req
 * @returns {import("./symbolic-protocol.ts").SymbolicResult}
 */
function run(req) {
  switch (req.op) {
    case "simplify":
      return { kind: "text", text: cas(`simplify(${req.expression})`) };
    case "expand":
      return { kind: "text", text: cas(`expand(${req.expression})`) };
    case "solve":
      return { kind: "text", text: cas(`solve(${req.expression}, ${req.variable})`) };
    case "is_zero": {
      // Each candidate is the same difference with more definitions substituted; any one that
      // reduces to 0 proves the identity, because substitution preserves it.
      for (let level = 0; level < req.candidates.length; level += 1) {
        const c = req.candidates[level];
        if (cas(c) === "0" || cas(`simplify(${c})`) === "0" || cas(`expand(${c})`) === "0") {
          return { kind: "zero", zero: true, level };
        }
      }
      return { kind: "zero", zero: false, level: -1 };
    }
    case "ping":
      return { kind: "text", text: "pong" };
    default:
      throw new Error("unknown operation");
  }
}

const port = parentPort;
if (port === null) throw new Error("symbolic-worker must run in a worker thread");

// The threads that answer requests get the cores first (WORKER_NICE, docs/operations.md).
lowerThisThread(workerData?.nice);

port.on("message", (/** @type {import("./symbolic-protocol.ts").SymbolicRequest} */ req) => {
  try {
    port.postMessage({ id: req.id, ok: true, result: run(req) });
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    port.postMessage({ id: req.id, ok: false, error: message.slice(0, 500) });
  }
});

// Warm the parser and simplifier once so the first real job does not pay for it.
cas("simplify(x^2-x^2)");
port.postMessage({ ready: true });
