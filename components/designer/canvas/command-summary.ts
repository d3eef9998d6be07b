/** One line saying what a step tells the rig to do, with units, for nodes and lists. */
import type { Command } from "@/machines/schema";

export function commandSummary(c: Command): string {
  switch (c.kind) {
    case "flow":
      return `flow ${c.flow} L/min`;
    case "pressure":
      return c.rise && c.rise !== "0" ? `pressure ${c.target} cmH2O, rise ${c.rise} s` : `pressure ${c.target} cmH2O`;
    case "arm":
      return `arm to ${c.angle}° at ${c.pulseRate} Hz`;
    case "release":
      return "release (valve open)";
    case "hold":
      return "hold still (valve closed)";
  }
}
