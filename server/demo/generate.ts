// The demo network: an invented regional CPR training network with two years of classes, attempts,
// compression streams and equipment events, written in Quarterbeat's own import formats. The same seed and
// "today" always give byte-identical files. The story it tells is in scenario.ts.
import { runClasses } from "./attempts";
import { classConsumables } from "./consumables";
import { buildDirectory, type DemoAccount, type DemoInstructor, type DemoSite } from "./directory";
import { equipmentLog } from "./equipment";
import { buildFleet } from "./fleet";
import { attemptsCsv, classesCsv, compressionsCsv, equipmentCsv } from "./importFiles";
import { Random } from "./random";
import { DEMO_SCENARIO } from "./scenario";
import { plantReturningLearners } from "./returningLearners";
import { planClasses } from "./schedule";
import { splitStreamAttempts } from "./streamChoice";
import { buildTimeline } from "./timeline";

export interface DemoNetworkOptions {
  seed?: number;
  /** YYYY-MM-DD; the last quarter of history is the one containing this day, and nothing is dated later. */
  today?: string;
}

export interface DemoNetwork {
  network: { name: string; region: string };
  sites: DemoSite[];
  instructors: DemoInstructor[];
  accounts: DemoAccount[];
  /** CSV text of the four import files. */
  files: { classes: string; attempts: string; compressions: string; equipment: string };
}

export function generateDemoNetwork(options: DemoNetworkOptions = {}): DemoNetwork {
  const scenario = DEMO_SCENARIO;
  const seed = options.seed ?? scenario.defaultSeed;
  if (!Number.isInteger(seed)) throw new RangeError(`The demo seed must be a whole number, got ${seed}`);
  const today = options.today ?? scenario.referenceToday;
  const timeline = buildTimeline(today, scenario.referenceToday, scenario.historyQuarters);

  const fleet = buildFleet(scenario, timeline, Random.forPart(seed, "fleet"));
  const planned = planClasses(scenario, timeline, fleet, Random.forPart(seed, "schedule"));
  const outcomes = runClasses(planned, scenario, timeline, Random.forPart(seed, "attempts"));
  plantReturningLearners(outcomes, scenario, Random.forPart(seed, "returns"));
  const consumablesRandom = Random.forPart(seed, "consumables");
  const classes = outcomes.map((outcome) => ({
    ...outcome,
    consumables: classConsumables(outcome.plannedClass, scenario, timeline, consumablesRandom),
  }));
  const { summaries, streams } = splitStreamAttempts(
    outcomes.flatMap((o) => o.attempts),
    scenario.attempts.streams,
    Random.forPart(seed, "streams"),
  );

  return {
    ...buildDirectory(scenario),
    files: {
      classes: classesCsv(classes),
      attempts: attemptsCsv(summaries),
      compressions: compressionsCsv(streams),
      equipment: equipmentCsv(equipmentLog(fleet, classes)),
    },
  };
}
