/**
 * Typed errors for route handlers. `message` is public (shown to the user); `cause` is private
 * (logged, never sent). Anything that is not an ApiError becomes a 500 with a generic message.
 */
export type FieldErrors = Record<string, string[]>;

export class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly fields?: FieldErrors,
    options?: { cause?: unknown; headers?: Record<string, string> },
  ) {
    super(message, options?.cause === undefined ? undefined : { cause: options.cause });
    this.name = "ApiError";
    this.headers = options?.headers;
  }
  readonly headers?: Record<string, string>;
}

export const badRequest = (message = "The request is not valid.", fields?: FieldErrors) =>
  new ApiError(400, message, fields);
export const unauthorized = (message = "Sign in to continue.") => new ApiError(401, message);
export const forbidden = (message = "Your role does not allow this.") => new ApiError(403, message);
/** Also for records the caller may not see: never reveal that they exist. */
export const notFound = (what = "That record") => new ApiError(404, `${what} was not found.`);
export const conflict = (message: string, fields?: FieldErrors) => new ApiError(409, message, fields);
export const tooManyRequests = (message: string, retryAfterS: number) =>
  new ApiError(429, message, undefined, { headers: { "Retry-After": String(Math.max(1, Math.ceil(retryAfterS))) } });

/** JSON body of every error response. */
export interface ErrorBody {
  error: string;
  fields?: FieldErrors;
}

/** Postgres error codes we translate; anything else stays a 500. */
export function pgErrorCode(err: unknown): string | undefined {
  for (let e: unknown = err, depth = 0; e && depth < 4; e = (e as { cause?: unknown }).cause, depth++) {
    const code = (e as { code?: unknown }).code;
    if (typeof code === "string" && /^[0-9A-Z]{5}$/.test(code)) return code;
  }
  return undefined;
}
export const isUniqueViolation = (err: unknown) => pgErrorCode(err) === "23505";
