import { render, screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { BreathTable } from "@/components/runs/breath-table";
import { BREATHS } from "./fixtures";

/** jsdom's Blob has no text(); FileReader reads it. */
function readText(blob: Blob): Promise<string> {
  return new Promise((resolve, reject) => {
    const reader = new FileReader();
    reader.onload = () => resolve(String(reader.result));
    reader.onerror = () => reject(reader.error);
    reader.readAsText(blob);
  });
}

function breathOrder(): string[] {
  return screen.getAllByTestId("breath-row").map((row) => row.getAttribute("data-breath-index") ?? "");
}

describe("BreathTable", () => {
  it("lists every breath with units in the column headers", () => {
    render(<BreathTable breaths={BREATHS} selected={null} onSelect={() => {}} csvName="b.csv" />);
    expect(screen.getAllByTestId("breath-row")).toHaveLength(3);
    expect(screen.getByTestId("breath-count")).toHaveTextContent("(3)");
    const headers = screen.getAllByRole("columnheader").map((h) => h.textContent);
    expect(headers).toContain("PIPcmH2O");
    expect(headers).toContain("VtimL");
    expect(headers).toContain("Latencyms");
    const second = screen.getAllByTestId("breath-row")[1];
    expect(within(second).getByText("patient")).toBeInTheDocument();
    expect(within(second).getByText("19.3")).toBeInTheDocument();
  });

  it("sorts by a column, ascending then descending, missing values last", async () => {
    const user = userEvent.setup();
    render(<BreathTable breaths={BREATHS} selected={null} onSelect={() => {}} csvName="b.csv" />);
    await user.click(screen.getByTestId("sort-pip"));
    const pipHeader = screen.getByTestId("sort-pip").closest("th")!;
    // PIP: 21.5, 19.25, 24. The first click on a number column sorts descending in TanStack Table.
    const first = pipHeader.getAttribute("aria-sort");
    expect(first === "ascending" ? breathOrder() : breathOrder().reverse()).toEqual(["2", "1", "3"]);
    await user.click(screen.getByTestId("sort-pip"));
    expect(pipHeader.getAttribute("aria-sort")).toBe(first === "ascending" ? "descending" : "ascending");
    expect(pipHeader.getAttribute("aria-sort") === "ascending" ? breathOrder() : breathOrder().reverse()).toEqual(["2", "1", "3"]);

    // Latency is known only for breath 2: it stays first whichever way the column is sorted.
    await user.click(screen.getByTestId("sort-latencyMs"));
    expect(breathOrder()[0]).toBe("2");
    await user.click(screen.getByTestId("sort-latencyMs"));
    expect(breathOrder()[0]).toBe("2");
  });

  it("calls back with the breath's position on a row click or Enter, also when sorted", async () => {
    const user = userEvent.setup();
    const onSelect = vi.fn();
    render(<BreathTable breaths={BREATHS} selected={2} onSelect={onSelect} csvName="b.csv" />);
    await user.click(screen.getByTestId("sort-vti")); // 480, 530, 455 → order changes
    const rowOfBreath2 = screen.getAllByTestId("breath-row").find((r) => r.getAttribute("data-breath-index") === "2")!;
    await user.click(within(rowOfBreath2).getByText("530"));
    expect(onSelect).toHaveBeenLastCalledWith(1);
    const rowOfBreath1 = screen.getAllByTestId("breath-row").find((r) => r.getAttribute("data-breath-index") === "1")!;
    rowOfBreath1.focus();
    await user.keyboard("{Enter}");
    expect(onSelect).toHaveBeenLastCalledWith(0);
    const selected = screen.getAllByTestId("breath-row").filter((r) => r.getAttribute("aria-selected") === "true");
    expect(selected.map((r) => r.getAttribute("data-breath-index"))).toEqual(["3"]);
  });

  describe("CSV download", () => {
    let blobs: Blob[];
    let clicked: { href: string; download: string }[];
    beforeEach(() => {
      blobs = [];
      clicked = [];
      // jsdom has no object URLs; record the Blob instead.
      Object.assign(URL, {
        createObjectURL: (blob: Blob) => {
          blobs.push(blob);
          return "blob:breaths";
        },
        revokeObjectURL: () => {},
      });
      vi.spyOn(HTMLAnchorElement.prototype, "click").mockImplementation(function (this: HTMLAnchorElement) {
        clicked.push({ href: this.href, download: this.download });
      });
    });
    afterEach(() => {
      vi.restoreAllMocks();
      Reflect.deleteProperty(URL, "createObjectURL");
      Reflect.deleteProperty(URL, "revokeObjectURL");
    });

    it("saves the table as shown, in its current order, with a unit header", async () => {
      const user = userEvent.setup();
      render(<BreathTable breaths={BREATHS} selected={null} onSelect={() => {}} csvName="run-a-breaths.csv" />);
      await user.click(screen.getByTestId("sort-start"));
      if (screen.getByTestId("sort-start").closest("th")!.getAttribute("aria-sort") === "ascending") {
        await user.click(screen.getByTestId("sort-start"));
      }
      await user.click(screen.getByTestId("breath-csv-download"));
      expect(clicked).toEqual([{ href: "blob:breaths", download: "run-a-breaths.csv" }]);
      expect(blobs).toHaveLength(1);
      expect(blobs[0].type).toBe("text/csv;charset=utf-8");
      const lines = (await readText(blobs[0])).trimEnd().split("\r\n");
      expect(lines[0]).toMatch(/^Breath,Start \(s\),Trigger,Latency \(ms\),PIP \(cmH2O\),/);
      expect(lines.slice(1).map((l) => l.split(",")[0])).toEqual(["3", "2", "1"]);
      expect(lines[2]).toContain(",patient,60,19.25,");
    });
  });
});
