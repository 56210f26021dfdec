/** Why a derivation cannot be made (a degenerate order, a missing input), with the input it is about. */
export type DerivationErrorCode = "degenerate_order" | "bad_order" | "no_input" | "missing_value";

export class DerivationError extends Error {
  override readonly name = "DerivationError";
  constructor(
    readonly code: DerivationErrorCode,
    message: string,
    /** Which input the error is about: "energy", "flux", "frequency_drift" or "evaluate_at". */
    readonly field: string,
  ) {
    super(message);
  }
}
