// Seeds the invented demo network: its directory (sites, instructors, one account per role) directly, then
// its four data files through the same import service the CLI and the web upload use, the quality lead's
// improvement actions, and the alert digest an import would have mailed, written into the local outbox.
import { Readable } from "node:stream";
import { count, eq } from "drizzle-orm";
import type { ImportKind } from "../../shared/domain";
import type { ImportSummary } from "../../shared/import/api";
import { buildDirectory } from "../demo/directory";
import { generateDemoNetwork, type DemoNetwork } from "../demo/generate";
import { recordDemoActions } from "../demo/improvementActions";
import { DEMO_SCENARIO } from "../demo/scenario";
import { buildTimeline } from "../demo/timeline";
import { sendImportAlerts } from "../alerts/importAlerts";
import { createOutboxMailer } from "../mail/outboxMailer";
import type { Db } from "../db/client";
import { attempts, classes, importBatches, instructors, sites, users } from "../db/schema";
import { AppError } from "../errors";
import { importFile } from "../imports/service";
import { generateReport, markReleased } from "../reports/store";
import { previousQuarter, quarterOf } from "../../shared/period";
import { setSetting } from "../settings/store";
import { createInstructor, createSite, listInstructors, listSites } from "../sites/service";
import { createUser, findActiveUser, findUserByEmail } from "../users/service";

export interface SeedResult {
  network: DemoNetwork["network"];
  accounts: DemoNetwork["accounts"];
  imports: ImportSummary[];
}

/** Files in dependency order: classes create sites, instructors and manikins; attempts need classes. */
const ORDER: ImportKind[] = ["classes", "equipment", "attempts", "compressions"];

export function isEmpty(db: Db): boolean {
  const [{ n }] = db.select({ n: count() }).from(users).all();
  const [{ c }] = db.select({ c: count() }).from(classes).all();
  return n === 0 && c === 0;
}

/** Removes every imported row, person, action and outbox message, for `demo seed --force`. Policy versions and settings stay. */
export function clearNetwork(db: Db): void {
  const sqlite = db.$client;
  sqlite.transaction(() => {
    for (const table of [
      "score_history",
      "compression_streams",
      "attempts",
      "equipment_events",
      "classes",
      "manikins",
      "rejected_rows",
      "batch_changes",
      "report_sends",
      "reports",
      "action_notes",
      "improvement_actions",
      "alert_deliveries",
      "mailbox",
      "quarter_notes",
      "import_presets",
      "import_batches",
      "sessions",
      "users",
      "instructors",
      "sites",
    ]) {
      sqlite.prepare(`DELETE FROM ${table}`).run();
    }
  })();
}

export async function seedDemo(db: Db, options: { today?: string; seed?: number } = {}): Promise<SeedResult> {
  const today = options.today ?? new Date().toISOString().slice(0, 10);
  const demo = generateDemoNetwork({ seed: options.seed, today });
  setSetting(db, "network_name", demo.network.name);
  setSetting(db, "network_region", demo.network.region);

  for (const site of demo.sites) {
    if (!listSites(db).some((s) => s.code === site.code)) createSite(db, site);
  }
  const siteIds = new Map(listSites(db).map((s) => [s.code, s.id]));
  for (const instructor of demo.instructors) {
    if (!listInstructors(db).some((i) => i.code === instructor.code)) {
      createInstructor(db, { code: instructor.code, name: instructor.name, siteId: siteIds.get(instructor.site) ?? null });
    }
  }
  const instructorIds = new Map(listInstructors(db).map((i) => [i.code, i.id]));
  let qualityLeadId: number | null = null;
  for (const account of demo.accounts) {
    const user = await createUser(db, {
      email: account.email,
      displayName: account.displayName,
      role: account.role,
      instructorId: account.instructor ? (instructorIds.get(account.instructor) ?? null) : null,
      password: account.password,
    });
    if (account.role === "quality_lead") qualityLeadId = user.id;
  }

  const imports: ImportSummary[] = [];
  for (const kind of ORDER) {
    const summary = await importFile(db, {
      kind,
      input: { stream: Readable.from([demo.files[kind]]), fileName: `demo-${kind}.csv` },
      source: "seed",
    });
    if (summary.status !== "imported") {
      const first = summary.issues[0];
      throw new AppError("seed_failed", 500, `The demo ${kind} file was refused: row ${first?.row}, ${first?.column}: ${first?.reason}`);
    }
    imports.push(summary);
  }
  // A funder signing in to the demo finds the last complete quarter's report already released (no notice
  // e-mail: the demo's funder accounts are being made in this same run).
  const issued = await generateReport(db, previousQuarter(quarterOf(today)));
  markReleased(db, issued.id, null);
  const qualityLead = qualityLeadId === null ? undefined : findActiveUser(db, qualityLeadId);
  if (qualityLead) {
    recordDemoActions(db, DEMO_SCENARIO, buildTimeline(today, DEMO_SCENARIO.referenceToday, DEMO_SCENARIO.historyQuarters), qualityLead, siteIds);
  }
  // What each account would have been mailed after the imports by its role's default choice (the coordinator
  // and the quality lead: an instructor outside the funnel limits, the network's shift, a manikin due for
  // service, the drifting manikin), kept in the outbox and in the Alerts page's history: a demo mails no one.
  await sendImportAlerts(db, createOutboxMailer(db), today);
  return { network: demo.network, accounts: demo.accounts, imports };
}

export function seedCounts(db: Db) {
  const one = (table: typeof sites | typeof instructors | typeof classes | typeof attempts | typeof importBatches) =>
    db.select({ n: count() }).from(table).all()[0].n;
  return {
    sites: one(sites),
    instructors: one(instructors),
    classes: one(classes),
    attempts: one(attempts),
    streams: db.select({ n: count() }).from(attempts).where(eq(attempts.source, "stream")).all()[0].n,
    batches: one(importBatches),
  };
}

/** The demo accounts that still exist and are active, to print at start-up. */
export function demoAccountsPresent(db: Db): DemoNetwork["accounts"] {
  return buildDirectory(DEMO_SCENARIO).accounts.filter((account) => findUserByEmail(db, account.email)?.active);
}
