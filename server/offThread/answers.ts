// The answers that may take long on a large network, by name: the worker thread computes them from
// these names and plain arguments, and the server computes the same functions in-process when it cannot use a
// worker (a database in memory). One table, so both ways answer with the same code.
import type { Db } from "../db/client";
import { overview } from "../insight/overview";
import { standing } from "../insight/standing";
import { instructorDetail, instructorTable } from "../insight/instructors";
import { techniqueErrorAnalysis } from "../insight/techniqueErrors";
import { attemptList } from "../insight/attempts";
import { currentSignals } from "../alerts/signals";
import { driftAnswer, fleetAnswer, manikinAnswer } from "../equipment/answers";

export const offThreadAnswers = {
  overview,
  standing,
  instructors: instructorTable,
  instructor: instructorDetail,
  techniqueErrors: techniqueErrorAnalysis,
  // a page of a large result still counts and sorts the whole result
  attempts: attemptList,
  fleet: fleetAnswer,
  drift: driftAnswer,
  manikin: manikinAnswer,
  // the checks after an import read the whole network (funnel, drift, run charts)
  signals: currentSignals,
} satisfies Record<string, (db: Db, ...args: never[]) => unknown>;

export type AnswerName = keyof typeof offThreadAnswers;
export type AnswerArgs<N extends AnswerName> = (typeof offThreadAnswers)[N] extends (db: Db, ...args: infer A) => unknown ? A : never;

/** The answer as JSON text, as the routes send it. */
export function answerJson<N extends AnswerName>(db: Db, name: N, args: AnswerArgs<N>): string {
  // each name's function takes that name's arguments; the table cannot say so to the compiler
  const compute = offThreadAnswers[name] as unknown as (db: Db, ...args: unknown[]) => unknown;
  return JSON.stringify(compute(db, ...(args as unknown[])));
}
