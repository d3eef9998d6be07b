import { render, screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { describe, expect, it, vi } from "vitest";
import { AlarmList } from "@/components/runs/alarm-list";
import { ALARMS, BREATHS } from "./fixtures";

describe("AlarmList", () => {
  it("lists alarms and breath events in time order, priorities in words", () => {
    render(<AlarmList alarms={ALARMS} breaths={BREATHS} onJump={() => {}} />);
    const rows = screen.getAllByTestId("alarm-row");
    expect(rows.map((r) => r.getAttribute("data-t"))).toEqual(["1.25", "3", "4.5"]);
    expect(within(rows[0]).getByText("Medium")).toBeInTheDocument();
    expect(within(rows[0]).getByText("1.25 s")).toBeInTheDocument();
    expect(within(rows[1]).getByText("Event")).toBeInTheDocument();
    expect(within(rows[2]).getByText("High")).toBeInTheDocument();
    expect(within(rows[2]).getByText("Airway pressure above 40 cmH2O")).toBeInTheDocument();
  });

  it("jumps to an alarm's time on click", async () => {
    const user = userEvent.setup();
    const onJump = vi.fn();
    render(<AlarmList alarms={ALARMS} breaths={BREATHS} onJump={onJump} />);
    await user.click(screen.getByText("Airway pressure above 40 cmH2O"));
    expect(onJump).toHaveBeenCalledTimes(1);
    expect(onJump.mock.calls[0][0]).toMatchObject({ t: 4.5, kind: "high-pressure", priority: "high" });
    await user.click(screen.getByText(/Double trigger/));
    expect(onJump.mock.calls[1][0]).toMatchObject({ t: 3, source: "event", breathPosition: 1 });
  });

  it("marks the event last jumped to", () => {
    render(<AlarmList alarms={ALARMS} breaths={BREATHS} onJump={() => {}} activeId="alarm-0" />);
    const current = screen.getAllByTestId("alarm-row").filter((r) => r.getAttribute("aria-current") === "true");
    expect(current).toHaveLength(1);
    expect(current[0]).toHaveTextContent("Airway pressure above 40 cmH2O");
  });

  it("says so when there is nothing to list", () => {
    render(<AlarmList alarms={[]} breaths={[]} onJump={() => {}} />);
    expect(screen.getByText(/No alarms or asynchrony events/)).toBeInTheDocument();
  });
});
