import { type ExpressionError } from "../expr/errors.ts";

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
  const key = err.definition !== undefined ? `definitions.${err.definition}` : field;
  return {
    status: 400,
    body: {
      error: {
        code: "invalid_expression",
        message: err.message,
        fields: { [key]: err.message },
        detail: {
          code: err.code,
          token: err.token,
          position: err.position,
          ...(err.definition !== undefined ? { definition: err.definition } : {}),
        },
      },
    },
  };
}
