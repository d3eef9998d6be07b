import { describe, expect, it } from "vitest";
import { BREATH_COLUMNS, breathsToCsv, columnHeader, displayCell } from "@/components/runs/lib/breath-columns";
import { BREATHS, makeBreath } from "../fixtures";

const column = (id: string) => BREATH_COLUMNS.find((c) => c.id === id)!;

describe("breath table CSV", () => {
  it("names every column with its unit in the header", () => {
    const header = breathsToCsv([]).split("\r\n")[0];
    expect(header).toBe(
      "Breath,Start (s),Trigger,Latency (ms),PIP (cmH2O),Plateau (cmH2O),PEEP (cmH2O),Vti (mL),Vte (mL),Ti (s),Te (s),I:E (1:x),Peak flow (L/min),Relief (mL),Flags",
    );
  });
  it("writes one row per breath at full precision, empty cells for missing values", () => {
    const lines = breathsToCsv(BREATHS).trimEnd().split("\r\n");
    expect(lines).toHaveLength(4);
    expect(lines[2]).toBe("2,3,patient,60,19.25,18,5,530,495,1,2,2,40,0,double-trigger");
    expect(lines[3]).toBe("3,6,operator,,24,,5,455,495,1,2,,40,0,");
  });
  it("quotes fields holding commas or quotes (RFC 4180)", () => {
    const odd = [{ ...column("trigger"), value: () => 'a,"b"' }];
    expect(breathsToCsv([makeBreath()], odd)).toBe('Trigger\r\n"a,""b"""\r\n');
  });
});

describe("breath table cells", () => {
  it("shows values with the column's decimals and I:E as 1:x", () => {
    expect(displayCell(column("pip"), BREATHS[1])).toBe("19.3");
    expect(displayCell(column("ie"), BREATHS[0])).toBe("1:2.0");
    expect(displayCell(column("latencyMs"), BREATHS[0])).toBe("—");
    expect(displayCell(column("flags"), makeBreath({ flags: ["short-cycle", "auto-trigger"] }))).toBe("short-cycle, auto-trigger");
    expect(columnHeader(column("vti"))).toBe("Vti (mL)");
  });
});
