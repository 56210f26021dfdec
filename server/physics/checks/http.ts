import { type ExpressionError } from "../expr/errors.ts";
import { budgetMessage, ExpressionBudgetError } from "../expr/symbols.ts";

/** The JSON body the API answers with for a rejected expression (same shape as other 400s). */
export interface ExpressionErrorBody {
  readonly error: {
    readonly code: "invalid_expression";
    readonly message: string;
    /** Field path -> message, so a form can show it under the right input. */
    readonly fields: Readonly<Record<string, string>>;
    readonly detail: {
      readonly code: ExpressionError["code"];
      readonly token: string;
      readonly position: number;
      readonly definition?: string;
      /** Over the evaluation budget: nodes once definitions are substituted, and the limit. */
      readonly size?: number;
      readonly cap?: number;
    };
  };
}

/**
 * Maps an ExpressionError to a 400. The field is "expression" unless the error sits inside a
 * named definition, then "definitions.<name>".
 */
export function expressionErrorToHttp(
  err: ExpressionError,
  field = "expression",
): { readonly status: 400; readonly body: ExpressionErrorBody } {
  const budget = err instanceof ExpressionBudgetError ? err : undefined;
  // A budget error knows where it sits inside the mapping ("derivation.flux.coefficient"); a caller
  // that checks several expressions passes the prefix as `field` ("theory.mappings.0").
  const key =
    err.definition !== undefined
      ? `definitions.${err.definition}`
      : budget !== undefined
        ? budgetField(field, budget.field)
        : field;
  const message = budget !== undefined ? budgetMessage(key, budget.size, budget.cap) : err.message;
  return {
    status: 400,
    body: {
      error: {
        code: "invalid_expression",
        message,
        fields: { [key]: message },
        detail: {
          code: err.code,
          token: err.token,
          position: err.position,
          ...(err.definition !== undefined ? { definition: err.definition } : {}),
          ...(budget !== undefined ? { size: budget.size, cap: budget.cap } : {}),
        },
      },
    },
  };
}

/** "expression" + "derivation.flux.coefficient" -> "derivation.flux.coefficient"; "theory.mappings.0" + "expression" -> "theory.mappings.0.expression". */
function budgetField(field: string, inner: string): string {
  return field === "expression" ? inner : `${field}.${inner}`;
}
