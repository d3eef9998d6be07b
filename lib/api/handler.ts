/**
 * The one wrapper every route handler goes through:
 *
 *   origin check (mutating methods) → zod parse (params, query, body) → authenticate → authorize → act → respond
 *
 * Usage (app/api/projects/route.ts):
 *
 *   export const POST = route(
 *     { allow: "projects:create", body: createProjectSchema, status: 201 },
 *     async ({ db, user, body, audit }) => createProject(db, user, body),
 *   );
 *
 * - `auth` defaults to "user" (401 without a valid session). "public" skips authentication entirely;
 *   "optional" authenticates when a cookie is present.
 * - `allow` is a role permission (lib/auth/roles.ts) or a predicate; failing it answers 403.
 *   Record-level access (membership) belongs in the query: a record the caller may not see answers 404.
 * - Return a value → JSON with `status` (default 200); return undefined → 204; return a Response → as is.
 * - Throw ApiError (lib/errors.ts) for expected failures; anything else is logged and answers 500.
 */
import "server-only";
import { z } from "zod";
import type { Session } from "lucia";
import { getDb, type Db } from "@/db";
import { recordAudit, type AuditInput } from "@/db/audit";
import { authenticateCookieHeader } from "@/lib/auth/session";
import { can, type Permission } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/types";
import { ApiError, isUniqueViolation, type ErrorBody, type FieldErrors } from "@/lib/errors";
import { clientIp, isSameOrigin, MUTATING_METHODS } from "./origin";

type AuthMode = "user" | "optional" | "public";
type AnySchema = z.ZodType;
type Out<S> = S extends z.ZodType ? z.output<S> : undefined;
type UserFor<A extends AuthMode> = A extends "user" ? SessionUser : SessionUser | null;

export interface RouteOptions<
  A extends AuthMode = "user",
  P extends AnySchema | undefined = undefined,
  Q extends AnySchema | undefined = undefined,
  B extends AnySchema | undefined = undefined,
> {
  auth?: A;
  allow?: Permission | ((user: SessionUser) => boolean);
  params?: P;
  query?: Q;
  body?: B;
  /** Status for a returned value (default 200). */
  status?: number;
  /** Largest accepted body in bytes (default 1 MiB). */
  maxBodyBytes?: number;
}

export interface RouteContext<A extends AuthMode, P, Q, B> {
  req: Request;
  db: Db;
  user: UserFor<A>;
  session: Session | null;
  params: Out<P>;
  query: Out<Q>;
  body: Out<B>;
  ip: string;
  /** Extra headers for the response (e.g. Set-Cookie); merged into whatever the handler returns. */
  headers: Headers;
  /** Record an audit entry with the caller as actor. */
  audit: (entry: Omit<AuditInput, "actorId">) => Promise<void>;
}

/** What Next passes as the second argument to a route handler. */
export interface NextRouteArgs {
  params: Promise<Record<string, string | string[] | undefined>>;
}

export type RouteHandler = (req: Request, args: NextRouteArgs) => Promise<Response>;

const DEFAULT_MAX_BODY = 1024 * 1024;

export function route<
  A extends AuthMode = "user",
  P extends AnySchema | undefined = undefined,
  Q extends AnySchema | undefined = undefined,
  B extends AnySchema | undefined = undefined,
>(
  options: RouteOptions<A, P, Q, B>,
  act: (ctx: RouteContext<A, P, Q, B>) => Promise<unknown>,
): RouteHandler {
  const authMode: AuthMode = options.auth ?? "user";
  return async (req, args) => {
    const headers = new Headers({ "Cache-Control": "no-store" });
    try {
      if (MUTATING_METHODS.has(req.method) && !isSameOrigin(req.headers)) {
        throw new ApiError(403, "This request came from another site and was refused.");
      }

      // 1. parse
      const rawParams = (await args?.params) ?? {};
      const params = options.params ? parseWith(options.params, rawParams, "params") : undefined;
      const query = options.query
        ? parseWith(options.query, Object.fromEntries(new URL(req.url).searchParams), "query")
        : undefined;
      const body = options.body
        ? parseWith(options.body, await readJsonBody(req, options.maxBodyBytes ?? DEFAULT_MAX_BODY), "body")
        : undefined;

      // 2. authenticate
      const db = await openDbOr503();
      let user: SessionUser | null = null;
      let session: Session | null = null;
      if (authMode !== "public") {
        const auth = await authenticateCookieHeader(db, req.headers.get("cookie"));
        if (auth?.setCookie) headers.append("Set-Cookie", auth.setCookie);
        if (auth?.user) {
          user = auth.user;
          session = "session" in auth ? auth.session : null;
        }
        if (!user && authMode === "user") throw new ApiError(401, "Sign in to continue.");
      }

      // 3. authorize (role level; record level is the query's job)
      if (options.allow && user) {
        const allowed = typeof options.allow === "function" ? options.allow(user) : can(user.role, options.allow);
        if (!allowed) throw new ApiError(403, "Your role does not allow this.");
      } else if (options.allow && !user) {
        throw new ApiError(401, "Sign in to continue.");
      }

      // 4. act
      const ctx: RouteContext<A, P, Q, B> = {
        req,
        db,
        user: user as UserFor<A>,
        session,
        params: params as Out<P>,
        query: query as Out<Q>,
        body: body as Out<B>,
        ip: clientIp(req.headers),
        headers,
        audit: (entry) => recordAudit(db, { ...entry, actorId: user?.id ?? null }),
      };
      const result = await act(ctx);

      // 5. respond
      if (result instanceof Response) {
        headers.forEach((value, key) => {
          if (key === "set-cookie") result.headers.append(key, value);
          else if (!result.headers.has(key)) result.headers.set(key, value);
        });
        return result;
      }
      if (result === undefined || result === null) return new Response(null, { status: 204, headers });
      return Response.json(result, { status: options.status ?? 200, headers });
    } catch (err) {
      return errorResponse(err, req, headers);
    }
  };
}

async function openDbOr503(): Promise<Db> {
  try {
    return await getDb();
  } catch (err) {
    throw new ApiError(503, "The database is not available. Try again shortly.", undefined, { cause: err });
  }
}

function parseWith(schema: AnySchema, value: unknown, where: "params" | "query" | "body"): unknown {
  const result = schema.safeParse(value);
  if (result.success) return result.data;
  // A malformed id in the path is a record that does not exist.
  if (where === "params") throw new ApiError(404, "Not found.");
  throw new ApiError(400, summarise(result.error), fieldErrors(result.error));
}

export function fieldErrors(error: z.ZodError): FieldErrors {
  const fields: FieldErrors = {};
  for (const issue of error.issues) {
    const key = issue.path.map(String).join(".") || "_";
    (fields[key] ??= []).push(issue.message);
  }
  return fields;
}

function summarise(error: z.ZodError): string {
  const root = error.issues.find((i) => i.path.length === 0);
  if (root) return root.message.endsWith(".") ? root.message : `${root.message}.`;
  return "Some fields are not valid.";
}

async function readJsonBody(req: Request, maxBytes: number): Promise<unknown> {
  const length = Number(req.headers.get("content-length") ?? "0");
  if (length > maxBytes) throw new ApiError(413, "The request body is too large.");
  const text = await req.text();
  if (text.length > maxBytes) throw new ApiError(413, "The request body is too large.");
  if (text.trim() === "") return undefined;
  try {
    return JSON.parse(text) as unknown;
  } catch {
    throw new ApiError(400, "The request body is not valid JSON.");
  }
}

function errorResponse(err: unknown, req: Request, headers: Headers): Response {
  let status = 500;
  let body: ErrorBody = { error: "Something went wrong on the server. The error has been logged." };
  if (err instanceof ApiError) {
    status = err.status;
    body = err.fields ? { error: err.message, fields: err.fields } : { error: err.message };
    for (const [k, v] of Object.entries(err.headers ?? {})) headers.set(k, v);
    if (err.cause !== undefined) console.error(`[api] ${req.method} ${pathOf(req)} → ${status}:`, err.cause);
  } else if (isUniqueViolation(err)) {
    status = 409;
    body = { error: "That already exists." };
    console.warn(`[api] ${req.method} ${pathOf(req)} → 409 (unique violation)`, err);
  } else {
    console.error(`[api] ${req.method} ${pathOf(req)} → 500`, err);
  }
  return Response.json(body, { status, headers });
}

function pathOf(req: Request): string {
  try {
    return new URL(req.url).pathname;
  } catch {
    return req.url;
  }
}
