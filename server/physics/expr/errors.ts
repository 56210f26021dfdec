/** Error codes of the expression front door; docs/physics-expressions.md lists them with examples. */
export type ExpressionErrorCode =
  | "bad_input"
  | "empty"
  | "too_long"
  | "too_deep"
  | "too_large"
  | "bad_character"
  | "forbidden_syntax"
  | "unbalanced"
  | "syntax"
  | "unknown_function"
  | "undeclared_symbol"
  | "forbidden_symbol"
  | "bad_declaration"
  | "bad_definition"
  | "definition_cycle";

/**
 * A rejected expression. `token` is the offending text and `position` its 0-based index in the
 * expression (or in the definition named by `definition`), so a form can underline it.
 */
export class ExpressionError extends Error {
  override readonly name = "ExpressionError";
  readonly code: ExpressionErrorCode;
  readonly token: string;
  readonly position: number;
  /** Set when the error sits inside a named definition rather than the main expression. */
  readonly definition: string | undefined;

  constructor(
    code: ExpressionErrorCode,
    message: string,
    token = "",
    position = 0,
    definition?: string,
  ) {
    super(message);
    this.code = code;
    this.token = token;
    this.position = position;
    this.definition = definition;
  }
}

export function isExpressionError(err: unknown): err is ExpressionError {
  return err instanceof ExpressionError;
}

/** Shows a token in a message; control and invisible characters appear as U+XXXX. */
export function showToken(token: string): string {
  let out = "";
  for (const ch of token) {
    const cp = ch.codePointAt(0) ?? 0;
    if (cp < 0x20 || (cp >= 0x7f && cp <= 0xa0) || cp === 0x2028 || cp === 0x2029 || isInvisible(cp)) {
      out += `U+${cp.toString(16).toUpperCase().padStart(4, "0")}`;
    } else {
      out += ch;
    }
  }
  return out.length > 40 ? `${out.slice(0, 37)}...` : out;
}

function isInvisible(cp: number): boolean {
  return (cp >= 0x200b && cp <= 0x200f) || cp === 0xfeff || (cp >= 0x2060 && cp <= 0x206f);
}
