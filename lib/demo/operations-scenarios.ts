/**
 * The demo scenarios of lift operations: several trains on one lift (dispatch) and a stop on the lift with
 * a restart. A block of their own, appended to DEMO_SCENARIOS (park.ts); values as in park.ts (invented park).
 */
import type { DemoScenario } from "./park";

export const OPERATIONS_DEMO_SCENARIOS: DemoScenario[] = [
  {
    key: "foxglove-two-train-dispatch",
    name: "Foxglove: two-train dispatch",
    lift: "foxglove",
    revision: 1,
    train: "foxglove-train",
    loading: "empty",
    entrySpeed: 1.9,
    startPosition: 14,
    followers: [{ train: "foxglove-train", loading: "empty", entrySpeed: 1.9, startPosition: 14, startTime: 12 }],
    runSettings: { duration: 40, segments: 60 },
    notes:
      "Two empty trains dispatched 12 s apart onto the same chain: the second train's dog engages while the first is still being carried up, so for most of the climb the chain, the drive and the take-up carry both.",
    shows: "two trains on one lift: the second is picked up while the first is still on the chain",
    expect: [
      { field: "trains.0.engagementTime", op: "<", value: 5, why: "the first train is picked up at the foot of the lift" },
      { field: "trains.1.engagementTime", op: ">", value: 12, why: "the second train is picked up after it is dispatched" },
      { field: "dispatchOverlap", op: ">", value: 5, why: "the second train is on the chain for more than 5 s before the first one's dog lets go" },
    ],
  },
  {
    key: "emberline-stop-and-restart",
    name: "Emberline: emergency stop, settle-back and restart",
    lift: "emberline",
    revision: 1,
    train: "emberline-train",
    loading: "full",
    entrySpeed: 2.2,
    startPosition: 14,
    dynamics: { drive: { stop: { kind: "brake", time: 15, duration: 0.3 }, restart: { time: 22 } } },
    runSettings: { duration: 35, segments: 60 },
    notes:
      "A brake stop 15 s into the climb holds the chain within 0.3 s. The full train was moving at chain speed: its momentum against the stiffness of the chain behind it swings the dog force down past zero, the dog unloads and the train rolls back onto the anti-rollback device. The drive restarts at 22 s and the dog picks the train up again.",
    shows: "a brake stop on the lift: the train settles back onto the ARD, then the restart picks it up again",
    expect: [
      { field: "stop.predictsRollback", op: "==", value: true, why: "v·√(k·m) exceeds the load F: the inequality predicts the settle-back" },
      { field: "stop.ardCatches", op: ">=", value: 1, why: "the train rolls back onto the ARD after the stop" },
      { field: "stop.rollback", op: ">", value: 0.01, why: "it rolls back measurably (more than 1 cm)" },
      { field: "stop.restartToPickup", op: "<", value: 5, why: "the restarted chain picks the train up again within 5 s" },
    ],
  },
];
