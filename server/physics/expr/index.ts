// The safe-expression half of the physics engine: guard -> AST -> definitions -> compile / LaTeX / CAS pool.
export { FUNCTIONS, parse, type Node } from "./ast.ts";
export { compileExpression, compileVectorized } from "./compile.ts";
export { formatDimension, inferDimension, type DimensionResult } from "./dimension.ts";
export { ExpressionError, isExpressionError, type ExpressionErrorCode } from "./errors.ts";
export { guardExpression, type GuardedExpression, type GuardOptions } from "./guard.ts";
export { symbolLatex, toLatex } from "./latex.ts";
export {
  closeSymbolicPool,
  getSymbolicPool,
  SymbolicError,
  SymbolicPool,
  SymbolicTimeoutError,
  type SymbolicPoolOptions,
} from "./pool.ts";
export { printExpression } from "./print.ts";
export {
  BUILTIN_SYMBOL_NAMES,
  createSymbolTable,
  expandAst,
  expandDefinitions,
  type CouplingDeclaration,
  type DefinitionDeclaration,
  type SymbolInfo,
  type SymbolTable,
  type SymbolTableInput,
} from "./symbols.ts";
