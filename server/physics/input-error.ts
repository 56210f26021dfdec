/**
 * A physics input the engine refuses, with the name of the field at fault so the HTTP layer can
 * put the message beside that field. Pure: no dependency on the server's error classes.
 */
export class PhysicsInputError extends Error {
  readonly field: string;

  constructor(field: string, message: string) {
    super(message);
    this.name = "PhysicsInputError";
    this.field = field;
  }
}

/** Throws unless `value` is a finite number. */
export function requireFinite(field: string, value: unknown): number {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new PhysicsInputError(field, `${field} must be a finite number`);
  }
  return value;
}
