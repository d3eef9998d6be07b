/** The editor's save call turns every answer of POST /api/sequences/:id/revisions into an outcome. */
import { describe, expect, it, vi } from "vitest";
import { saveRevision } from "@/components/designer/model/revisions-api";
import { assistDoc } from "./fixtures";

function answer(status: number, body: unknown) {
  return vi.fn(async (_url: string | URL | Request, _init?: RequestInit) => new Response(JSON.stringify(body), { status, headers: { "content-type": "application/json" } }));
}

const request = () => ({ ...assistDoc(), message: "m", baseRevision: 3 });

describe("saveRevision", () => {
  it("posts definition, layout, message and base revision; 201 gives the new number", async () => {
    const f = answer(201, { id: "r", number: 4, hash: "ab", problems: [{ id: "w", severity: "warning", message: "x", target: { type: "definition" } }] });
    const out = await saveRevision("seq-1", request(), f as unknown as typeof fetch);
    expect(out).toEqual({ kind: "saved", number: 4, hash: "ab", warnings: [expect.objectContaining({ id: "w" })] });
    const [url, init] = f.mock.calls[0];
    expect(url).toBe("/api/sequences/seq-1/revisions");
    expect(init?.method).toBe("POST");
    const body = JSON.parse(String(init?.body)) as Record<string, unknown>;
    expect(Object.keys(body).sort()).toEqual(["baseRevision", "definition", "layout", "message"]);
    expect(body.baseRevision).toBe(3);
  });

  it("409 with a newer revision is stale; 409 without one (archived) is a refusal", async () => {
    expect(await saveRevision("s", request(), answer(409, { error: "Revision 5 was saved after", latestRevision: 5 }) as unknown as typeof fetch)).toEqual({
      kind: "stale",
      error: "Revision 5 was saved after",
      latestRevision: 5,
    });
    expect(await saveRevision("s", request(), answer(409, { error: "archived", latestRevision: 3 }) as unknown as typeof fetch)).toEqual({ kind: "refused", status: 409, error: "archived" });
  });

  it("422 carries the blocking problems; 403 and 400 the server's error", async () => {
    const problems = [{ id: "no-exit", severity: "error", message: "stuck", target: { type: "step", step: "hold2" } }];
    expect(await saveRevision("s", request(), answer(422, { error: "1 blocking problem", problems }) as unknown as typeof fetch)).toEqual({ kind: "invalid", error: "1 blocking problem", problems });
    expect(await saveRevision("s", request(), answer(403, { error: "Your role does not allow this." }) as unknown as typeof fetch)).toEqual({ kind: "refused", status: 403, error: "Your role does not allow this." });
    expect(await saveRevision("s", request(), answer(400, { error: "baseRevision must be a number" }) as unknown as typeof fetch)).toMatchObject({ kind: "refused", error: "baseRevision must be a number" });
  });

  it("a network failure keeps the edits and says so", async () => {
    const f = vi.fn(async () => {
      throw new TypeError("Failed to fetch");
    });
    expect(await saveRevision("s", request(), f as unknown as typeof fetch)).toMatchObject({ kind: "refused", status: 0, error: expect.stringMatching(/still here/) });
  });
});
