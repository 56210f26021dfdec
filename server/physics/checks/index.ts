export { checkMapping, type CheckMappingOptions } from "./check-mapping.ts";
export { compareBeta, type BetaComparison, type CompareOptions } from "./compare.ts";
export { derivePropagation, type PropagationTerm } from "./propagation.ts";
export { deriveBeta, DerivationError, type Derivation, type DerivedAmplitudeTerm, type DerivedPhaseTerm } from "./derive.ts";
export { measureDimension, type MeasuredDimension } from "./dimension-check.ts";
export { expressionErrorToHttp, type ExpressionErrorBody } from "./http.ts";
export { Rational } from "./rational.ts";
export type * from "./types.ts";
