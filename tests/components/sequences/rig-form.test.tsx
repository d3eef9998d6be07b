/**
 * The rig profile form takes values with units and stores canonical units: what reaches
 * PUT /api/projects/:id/rig is the same `{ rig }` of canonical numbers as before.
 */
import { render, screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { afterEach, describe, expect, it, vi } from "vitest";
import { RigForm } from "@/components/sequences/rig-form";
import { DEFAULT_RIG } from "@/lib/sim/default-rig";
import { rigSchema, type Rig } from "@/lib/sim/types";

afterEach(() => vi.unstubAllGlobals());

/** fetch that answers a PUT by echoing the rig back, as the server does after validating it. */
function stubFetch() {
  const fetchMock = vi.fn(async (_url: string, init?: RequestInit) => {
    const body = JSON.parse(String(init?.body)) as { rig: Rig };
    return Response.json({ rig: body.rig, updatedAt: "2026-01-01T00:00:00.000Z" });
  });
  vi.stubGlobal("fetch", fetchMock);
  return fetchMock;
}

function sentRig(fetchMock: ReturnType<typeof stubFetch>): Rig {
  expect(fetchMock).toHaveBeenCalledTimes(1);
  const [url, init] = fetchMock.mock.calls[0];
  expect(url).toBe("/api/projects/p1/rig");
  expect(init?.method).toBe("PUT");
  const body = JSON.parse(String(init?.body)) as { rig: Rig };
  expect(Object.keys(body)).toEqual(["rig"]);
  // The server validates with the same schema: the body must pass it unchanged.
  expect(rigSchema.parse(body.rig)).toEqual(body.rig);
  return body.rig;
}

function renderForm() {
  render(<RigForm projectId="p1" rig={structuredClone(DEFAULT_RIG)} updatedAt={null} canEdit />);
}

async function retype(input: HTMLElement, text: string) {
  await userEvent.clear(input);
  await userEvent.type(input, text);
}

const save = () => userEvent.click(screen.getByRole("button", { name: "Save rig profile" }));

describe("RigForm units", () => {
  it('"0.1 psi" in the PEEP valve is sent as ≈ 7.03 cmH2O (1 psi = 70.307 cmH2O, derived: 6894.757 Pa / 98.0665 Pa)', async () => {
    const fetchMock = stubFetch();
    renderForm();
    // The default valve follows the sequence's PEEP; give it its own setting first.
    await userEvent.click(screen.getByRole("checkbox", { name: /follows the sequence/ }));
    const valve = screen.getByRole("textbox", { name: "PEEP valve setting" });
    await retype(valve, "0.1 psi");
    await userEvent.tab();
    expect(screen.getByText("= 7.0307 cmH2O")).toBeInTheDocument();
    await save();
    const rig = sentRig(fetchMock);
    expect(rig.peepValveCmH2O).toBeCloseTo(7.0307, 3);
    // Everything else went as it was.
    expect({ ...rig, peepValveCmH2O: null }).toEqual(rigSchema.parse(DEFAULT_RIG));
  });

  it('"0.1 psi" in the relief valve field, and "15 ms" in the scan period, are stored canonical', async () => {
    const fetchMock = stubFetch();
    renderForm();
    await retype(screen.getByLabelText("Relief valve opening pressure"), "0.1 psi");
    await retype(screen.getByLabelText("Scan period"), "15 ms");
    await save();
    const rig = sentRig(fetchMock);
    expect(rig.reliefValveCmH2O).toBeCloseTo(7.0307, 3);
    expect(rig.scanPeriodS).toBeCloseTo(0.015, 12);
  });

  it("a bare number is taken in the canonical unit shown beside the field", async () => {
    const fetchMock = stubFetch();
    renderForm();
    const relief = screen.getByLabelText("Relief valve opening pressure");
    expect(within(relief.parentElement!).getByText("cmH2O")).toBeInTheDocument();
    await retype(relief, "45");
    await save();
    expect(sentRig(fetchMock).reliefValveCmH2O).toBe(45);
  });

  it('"3 mL" in a pressure field shows an error naming the field and sends nothing', async () => {
    const fetchMock = stubFetch();
    renderForm();
    const relief = screen.getByLabelText("Relief valve opening pressure");
    await retype(relief, "3 mL");
    await save();
    const alert = await screen.findByRole("alert");
    expect(alert).toHaveTextContent("Relief valve opening pressure: expected a pressure (cmH2O), got 3 mL (volume)");
    expect(relief).toHaveAttribute("aria-invalid", "true");
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it("an unknown unit in a calibration point is reported at that point", async () => {
    const fetchMock = stubFetch();
    renderForm();
    await retype(screen.getByLabelText("Volume of point 2"), "0.1 furlong");
    await save();
    expect(await screen.findByRole("alert")).toHaveTextContent(/Bag volume of point 2: unknown unit "furlong"/);
    expect(fetchMock).not.toHaveBeenCalled();
  });
});
