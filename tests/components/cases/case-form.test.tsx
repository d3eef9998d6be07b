/**
 * The patient case form takes values with units and sends canonical units: what reaches POST /api/cases
 * and PATCH /api/cases/:id is the same body of canonical numbers as before (the server checks `patient`
 * with patientSchema).
 *
 * Pressure factor: 1 hPa = 100 Pa and 1 cmH2O = 98.0665 Pa (conventional), so 1 hPa = 1.019716 cmH2O
 * (derived). A compliance per hPa is therefore divided by it (50 mL/hPa → 49.0333 mL/cmH2O), and a
 * resistance in hPa is multiplied by it (10 hPa/(L/s) → 10.19716 cmH2O/(L/s)).
 */
import { render, screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { afterEach, describe, expect, it, vi } from "vitest";
import { CaseForm } from "@/components/cases/case-form";
import { createCaseBody, type CreateCaseBody } from "@/lib/validation/cases";
import { patientSchema } from "@/lib/sim/types";

const router = { push: vi.fn(), refresh: vi.fn() };
vi.mock("next/navigation", () => ({ useRouter: () => router }));

const CMH2O_PER_HPA = 100 / 98.0665;

afterEach(() => {
  vi.unstubAllGlobals();
  router.push.mockClear();
  router.refresh.mockClear();
});

/** fetch that answers as the case API does: the new case's id on POST, the case on PATCH. */
function stubFetch() {
  const fetchMock = vi.fn(async (_url: string, init?: RequestInit) => {
    const body = JSON.parse(String(init?.body)) as CreateCaseBody;
    return Response.json({ id: "c-new", ...body }, { status: init?.method === "PATCH" ? 200 : 201 });
  });
  vi.stubGlobal("fetch", fetchMock);
  return fetchMock;
}

function sentBody(fetchMock: ReturnType<typeof stubFetch>, url = "/api/cases", method = "POST"): CreateCaseBody {
  expect(fetchMock).toHaveBeenCalledTimes(1);
  const [calledUrl, init] = fetchMock.mock.calls[0];
  expect(calledUrl).toBe(url);
  expect(init?.method).toBe(method);
  const body = JSON.parse(String(init?.body)) as CreateCaseBody;
  expect(Object.keys(body).sort()).toEqual(["description", "name", "patient", "source"]);
  // The server validates with the same schema: the body must pass it unchanged, numbers and all.
  expect(createCaseBody.parse(body)).toEqual(body);
  return body;
}

async function retype(input: HTMLElement, text: string) {
  await userEvent.clear(input);
  await userEvent.type(input, text);
}

async function renderNew() {
  render(<CaseForm />);
  await userEvent.type(screen.getByLabelText("Name"), "Units test");
}

const create = () => userEvent.click(screen.getByRole("button", { name: "Create case" }));

describe("CaseForm units", () => {
  it('"50 mL/hPa" in compliance is sent as ≈ 49.03 mL/cmH2O (50 / 1.019716, derived)', async () => {
    const fetchMock = stubFetch();
    await renderNew();
    await retype(screen.getByLabelText("Compliance"), "50 mL/hPa");
    expect(screen.getByText("= 49.0333 mL/cmH2O")).toBeInTheDocument();
    await create();
    const body = sentBody(fetchMock);
    expect(body.patient.complianceMlPerCmH2O).toBeCloseTo(50 / CMH2O_PER_HPA, 4);
    expect(body.patient.complianceMlPerCmH2O).toBeCloseTo(49.0333, 4);
    // Everything else went as the blank form had it.
    expect({ ...body.patient, complianceMlPerCmH2O: 50 }).toEqual(
      patientSchema.parse({ complianceMlPerCmH2O: 50, resistanceCmH2OPerLps: 5 }),
    );
    expect(router.push).toHaveBeenCalledWith("/cases/c-new");
  });

  it('"10 hPa/(L/s)" in resistance is sent as ≈ 10.197 cmH2O/(L/s) (10 × 1.019716, derived)', async () => {
    const fetchMock = stubFetch();
    await renderNew();
    await retype(screen.getByLabelText("Resistance"), "10 hPa/(L/s)");
    expect(screen.getByText("= 10.1972 cmH2O/(L/s)")).toBeInTheDocument();
    await create();
    expect(sentBody(fetchMock).patient.resistanceCmH2OPerLps).toBeCloseTo(10 * CMH2O_PER_HPA, 4);
  });

  it('"3 mL" in compliance shows an error naming the field and sends nothing', async () => {
    const fetchMock = stubFetch();
    await renderNew();
    const compliance = screen.getByLabelText("Compliance");
    await retype(compliance, "3 mL");
    await create();
    const alert = await screen.findByRole("alert");
    expect(alert).toHaveTextContent("Compliance: expected a compliance (mL/cmH2O), got 3 mL (volume)");
    expect(compliance).toHaveAttribute("aria-invalid", "true");
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it("a bare number is taken in the canonical unit shown beside the field", async () => {
    const fetchMock = stubFetch();
    await renderNew();
    const compliance = screen.getByLabelText("Compliance");
    expect(within(compliance.parentElement!).getByText("mL/cmH2O")).toBeInTheDocument();
    await retype(compliance, "42");
    await retype(screen.getByLabelText("Non-linear elastance E2"), "3.5");
    await retype(screen.getByLabelText("Variability"), "0.3");
    await create();
    const { patient } = sentBody(fetchMock);
    expect(patient.complianceMlPerCmH2O).toBe(42);
    expect(patient.e2CmH2OPerL2).toBe(3.5);
    expect(patient.effort.variability).toBe(0.3);
  });

  it("effort times, rate and the orifice leak convert from their own units", async () => {
    const fetchMock = stubFetch();
    await renderNew();
    await retype(screen.getByLabelText("Effort time"), "900 ms");
    await retype(screen.getByLabelText("First onset"), "0.5 min");
    await retype(screen.getByLabelText("Rate"), "0.3 Hz");
    await retype(screen.getByLabelText("Peak muscle pressure"), "5 hPa");
    await userEvent.selectOptions(screen.getByLabelText("Kind"), "orifice");
    await retype(screen.getByLabelText("Leak coefficient"), "0.25 L/s");
    await create();
    const { patient } = sentBody(fetchMock);
    expect(patient.effort.effortTimeS).toBeCloseTo(0.9, 12);
    expect(patient.effort.onsetS).toBeCloseTo(30, 12);
    expect(patient.effort.ratePerMin).toBeCloseTo(18, 12);
    expect(patient.effort.amplitudeCmH2O).toBeCloseTo(5 * CMH2O_PER_HPA, 4);
    expect(patient.leak).toEqual({ kind: "orifice", coefficient: 15 });
  });

  it('"30 %" in variability is refused, not stored as 30 (the field is a fraction)', async () => {
    const fetchMock = stubFetch();
    await renderNew();
    await retype(screen.getByLabelText("Variability"), "30 %");
    await create();
    expect(await screen.findByRole("alert")).toHaveTextContent('Variability: expected a plain number (fraction), got "30 %"');
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it("the linear leak coefficient (L/min per cmH2O) takes a bare number only", async () => {
    const fetchMock = stubFetch();
    await renderNew();
    await userEvent.selectOptions(screen.getByLabelText("Kind"), "linear");
    const coefficient = screen.getByLabelText("Leak coefficient");
    expect(within(coefficient.parentElement!).getByText("L/min per cmH2O")).toBeInTheDocument();
    await retype(coefficient, "2 L/min");
    await create();
    expect(await screen.findByRole("alert")).toHaveTextContent('Leak coefficient: expected a plain number (L/min per cmH2O), got "2 L/min"');
    expect(fetchMock).not.toHaveBeenCalled();
    await retype(coefficient, "2");
    await create();
    expect(sentBody(fetchMock).patient.leak).toEqual({ kind: "linear", coefficient: 2 });
  });

  it("editing sends the PATCH body in canonical units", async () => {
    const fetchMock = stubFetch();
    const patient = patientSchema.parse({ complianceMlPerCmH2O: 50, resistanceCmH2OPerLps: 5 });
    render(<CaseForm caseId="c1" initial={{ name: "Existing", description: "", source: "memory", patient }} />);
    await retype(screen.getByLabelText("Compliance"), "50 mL/hPa");
    await userEvent.click(screen.getByRole("button", { name: "Save case" }));
    const body = sentBody(fetchMock, "/api/cases/c1", "PATCH");
    expect(body).toEqual({ name: "Existing", description: "", source: "memory", patient: { ...patient, complianceMlPerCmH2O: body.patient.complianceMlPerCmH2O } });
    expect(body.patient.complianceMlPerCmH2O).toBeCloseTo(49.0333, 4);
    expect(await screen.findByText("Saved.")).toBeInTheDocument();
  });
});
