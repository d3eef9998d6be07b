/**
 * The definition revision 1 of a sequence gets when it is created without a template.
 * One standby step that only releases: the designer starts from a graph that draws and simulates
 * (nothing moves) and the engineer adds the breath cycle from the palette. It is deliberately not a
 * working sequence, so the static checks are expected to flag it until steps are added.
 */
import { FORMAT_ID, type SequenceDefinition } from "@/machines/schema";

export function blankDefinition(name: string): SequenceDefinition {
  return {
    format: FORMAT_ID,
    name,
    settings: {},
    monitors: [],
    machine: {
      id: "sequence",
      initial: "standby",
      states: {
        standby: {
          meta: {
            kind: "safe",
            label: "Standby",
            command: { kind: "release" },
            alarms: [],
            description: "Driver off, expiratory path open. Add the breath cycle from the palette.",
          },
        },
      },
    },
  };
}

export const BLANK_LAYOUT = { nodes: { standby: { x: 0, y: 0 } } } as const;
