// The demo network the journeys run on, seeded by playwright.config.ts's web server.

/** The demo network's "today": its current quarter is 2026-Q4. */
export const SEED_TODAY = "2026-12-01";
/** The quarter of SEED_TODAY: the latest quarter with data, which the insight pages open on. */
export const SEED_QUARTER = `${SEED_TODAY.slice(0, 4)}-Q${Math.ceil(Number(SEED_TODAY.slice(5, 7)) / 3)}`;

/** The SQLite file the server serves, named by playwright.config.ts for the whole run. */
export function servedDatabaseFile(): string {
  const file = process.env.QB_E2E_DB;
  if (!file) throw new Error("QB_E2E_DB is not set: run the journeys with `npm run test:e2e` (playwright.config.ts).");
  return file;
}
