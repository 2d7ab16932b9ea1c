// Which attempts reach the network as full compression streams rather than device summaries. Each attempt
// is in exactly one of the two files: the import derives a stream attempt's summary itself.
import type { AttemptRecord } from "./attempts";
import type { Random } from "./random";

export function splitStreamAttempts(attempts: AttemptRecord[], streamCount: number, random: Random): { summaries: AttemptRecord[]; streams: AttemptRecord[] } {
  const chosen = new Set(random.shuffled(attempts.map((a) => a.id)).slice(0, Math.min(streamCount, attempts.length)));
  return {
    summaries: attempts.filter((a) => !chosen.has(a.id)),
    streams: attempts.filter((a) => chosen.has(a.id)),
  };
}
