/**
 * The live preview's controller: paused / running / failed, and the speed. The component runs its
 * requestAnimationFrame loop exactly while the machine is `running`; stepping one scan pauses first.
 * The simulation itself stays outside the machine: it is a mutable engine object advanced per frame,
 * and machine context is for the controller's own state.
 */
import { assign, setup } from "xstate";

export const SPEEDS = [1, 2, 5] as const;
export type Speed = (typeof SPEEDS)[number];

export type PreviewEvent =
  | { type: "PLAY" }
  | { type: "PAUSE" }
  | { type: "STEP" }
  | { type: "SPEED"; speed: Speed }
  | { type: "FAIL"; error: string }
  /** A new simulation was built: leave `failed` if the last one had failed. */
  | { type: "RECOVER" };

export const previewMachine = setup({
  types: {
    context: {} as { speed: Speed; error: string | null },
    events: {} as PreviewEvent,
  },
}).createMachine({
  id: "preview",
  initial: "paused",
  context: { speed: 1, error: null },
  on: {
    FAIL: { target: ".failed", actions: assign({ error: ({ event }) => event.error }) },
    SPEED: { actions: assign({ speed: ({ event }) => event.speed }) },
  },
  states: {
    paused: {
      on: {
        PLAY: "running",
      },
    },
    running: {
      on: {
        PAUSE: "paused",
        STEP: "paused",
      },
    },
    failed: {
      on: {
        RECOVER: { target: "paused", actions: assign({ error: null }) },
      },
    },
  },
});
