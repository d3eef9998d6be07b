/** A minimal working definition for the unit tests: a timed pressure cycle, inhale ⇄ exhale. */
import type { SequenceDefinitionInput } from "@/machines/schema";

export function timedCycle(): SequenceDefinitionInput {
  return {
    format: "tidewright.sequence/1",
    name: "Timed pressure cycle",
    settings: {
      PEEP: { unit: "cmH2O", value: 5 },
      Pinsp: { unit: "cmH2O", value: 15 },
      Ti: { unit: "s", value: 1 },
      Te: { unit: "s", value: 2 },
    },
    machine: {
      id: "timed",
      initial: "inhale",
      states: {
        inhale: {
          meta: { kind: "inhale", command: { kind: "pressure", target: "PEEP + Pinsp", rise: "0.1" } },
          after: { Ti: { target: "exhale" } },
        },
        exhale: { meta: { kind: "exhale", command: { kind: "release" } }, after: { Te: { target: "inhale" } } },
      },
    },
  };
}
