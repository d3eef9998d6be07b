/**
 * fetch wrapper for client components: JSON in, JSON out, and the API's error body
 * (`{ error, fields? }`) turned into an ApiClientError the forms can show.
 */
export class ApiClientError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly fields: Record<string, string[]> = {},
  ) {
    super(message);
    this.name = "ApiClientError";
  }
}

export async function apiFetch<T>(path: string, init: { method?: string; body?: unknown } = {}): Promise<T> {
  let response: Response;
  try {
    response = await fetch(path, {
      method: init.method ?? (init.body === undefined ? "GET" : "POST"),
      headers: init.body === undefined ? undefined : { "content-type": "application/json" },
      body: init.body === undefined ? undefined : JSON.stringify(init.body),
      credentials: "same-origin",
    });
  } catch {
    throw new ApiClientError(0, "Could not reach the server. Check your connection and try again.");
  }
  if (response.status === 204) return undefined as T;
  const text = await response.text();
  let data: unknown = null;
  try {
    data = text ? JSON.parse(text) : null;
  } catch {
    // not JSON: fall through to the generic message
  }
  if (!response.ok) {
    const body = (data ?? {}) as { error?: unknown; fields?: unknown };
    throw new ApiClientError(
      response.status,
      typeof body.error === "string" ? body.error : `The server answered ${response.status}.`,
      (body.fields as Record<string, string[]> | undefined) ?? {},
    );
  }
  return data as T;
}
