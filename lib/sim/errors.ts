/** Errors of a simulation run, with a code the CLI and the server map to a response. */
export type SimErrorCode = "bad-input" | "loop" | "budget" | "cancelled" | "duration";

export class SimError extends Error {
  constructor(
    readonly code: SimErrorCode,
    message: string,
  ) {
    super(message);
    this.name = "SimError";
  }
}
