/**
 * Browser-side calls to our JSON API. Turns the shared error body `{ error, fields? }` into a typed
 * result so forms can show field messages and never have to guess at a failed response's shape.
 */
export type ApiResult<T> =
  | { ok: true; status: number; data: T }
  | { ok: false; status: number; error: string; fields?: Record<string, string[]>; body: Record<string, unknown> };

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === "object" && value !== null && !Array.isArray(value);
}

export async function sendJson<T>(url: string, method: "POST" | "PUT" | "PATCH", body: unknown): Promise<ApiResult<T>> {
  let response: Response;
  try {
    response = await fetch(url, {
      method,
      headers: { "content-type": "application/json" },
      body: JSON.stringify(body),
    });
  } catch {
    return { ok: false, status: 0, error: "Could not reach the server. Check the connection and try again.", body: {} };
  }
  const parsed: unknown = await response.json().catch(() => ({}));
  const data = isRecord(parsed) ? parsed : {};
  if (response.ok) return { ok: true, status: response.status, data: parsed as T };
  const error = typeof data.error === "string" ? data.error : `The server answered ${response.status}.`;
  const fields = isRecord(data.fields) ? (data.fields as Record<string, string[]>) : undefined;
  return { ok: false, status: response.status, error, fields, body: data };
}
