/**
 * Bad input to an engine function, naming the field (e.g. `confidence`). It is a RangeError so callers
 * that catch RangeError keep working; the server maps only this error (not a programming TypeError) to a 400.
 */
export class EngineInputError extends RangeError {
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(message);
    this.name = "EngineInputError";
  }
}
