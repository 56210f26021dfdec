/** Messages between pool.ts and symbolic-worker.ts. */
export type SymbolicOp =
  | { readonly op: "simplify"; readonly expression: string }
  | { readonly op: "expand"; readonly expression: string }
  | { readonly op: "solve"; readonly expression: string; readonly variable: string }
  | { readonly op: "is_zero"; readonly candidates: readonly string[] }
  | { readonly op: "ping" };

export type SymbolicRequest = SymbolicOp & { readonly id: number };

export type SymbolicResult =
  | { readonly kind: "text"; readonly text: string }
  | { readonly kind: "zero"; readonly zero: boolean; readonly level: number };

export type SymbolicResponse =
  | { readonly id: number; readonly ok: true; readonly result: SymbolicResult }
  | { readonly id: number; readonly ok: false; readonly error: string };
