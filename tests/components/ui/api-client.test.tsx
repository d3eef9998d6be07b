import { afterEach, describe, expect, it, vi } from "vitest";
import { apiFetch, ApiClientError } from "@/components/ui/api-client";

afterEach(() => vi.unstubAllGlobals());

describe("apiFetch", () => {
  it("turns the API's error body into an ApiClientError with field messages", async () => {
    vi.stubGlobal(
      "fetch",
      vi.fn(async () => Response.json({ error: "Some fields are not valid.", fields: { name: ["Give the project a name."] } }, { status: 400 })),
    );
    const err = await apiFetch("/api/projects", { body: { name: "" } }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ApiClientError);
    expect(err).toMatchObject({ status: 400, message: "Some fields are not valid.", fields: { name: ["Give the project a name."] } });
  });

  it("sends JSON and returns the parsed body; 204 gives undefined", async () => {
    const fetchMock = vi.fn(async (_url: string, init?: RequestInit) =>
      init?.method === "POST" ? new Response(null, { status: 204 }) : Response.json({ ok: true }),
    );
    vi.stubGlobal("fetch", fetchMock);
    expect(await apiFetch("/api/health")).toEqual({ ok: true });
    expect(await apiFetch("/api/auth/sign-out", { method: "POST" })).toBeUndefined();
  });

  it("explains a network failure in words", async () => {
    vi.stubGlobal("fetch", vi.fn(async () => Promise.reject(new TypeError("fetch failed"))));
    await expect(apiFetch("/api/me")).rejects.toThrow(/Could not reach the server/);
  });
});
