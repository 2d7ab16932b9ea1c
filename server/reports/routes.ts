// Funder report routes. Coordinators and funders read; only coordinators generate, write notes, release and
// send. Funders see released versions only: one not yet released is answered as missing.
//   GET  /reports                     stored versions (newest first), optional ?period=
//   GET  /reports/:period/preview     the report as it would be generated now (data + narrative; coordinators)
//   POST /reports/:period             generate and store the next version ({ includeActions } lists the improvement actions)
//   GET  /reports/:id/data            a stored version's data
//   GET  /reports/:id/pdf             a stored version's PDF, byte for byte (?inline=1: shown in the page)
//   GET  /reports/:id/csv             a stored version's figures as CSV
//   GET  /reports/:period/notes       the coordinator's text on what the network is doing about the errors
//   PUT  /reports/:period/notes
//   POST /reports/:id/release         let funders see a stored version; each active funder gets a notice
//   POST /reports/:id/send            e-mail a stored version with a cover note, one message per recipient
//   GET  /report-sends                every send, sent or failed
//   POST /report-sends/:id/retry      try a failed send again
import { Router, type Request } from "express";
import { can } from "../../shared/permissions";
import { generateReportSchema, quarterNotesSchema, sendReportSchema } from "../../shared/schemas/report";
import type { Db } from "../db/client";
import { allow, signedInUser } from "../auth/guard";
import { parseId, parseWith } from "../http/validate";
import { logReportSend } from "../logging/events";
import type { Logger } from "../logging/logger";
import type { Mailer } from "../mail/mailer";
import { reportCsv } from "./csvExport";
import { buildReportData, readQuarterNotes, reportPeriod, saveQuarterNotes } from "./data";
import { releaseReport } from "./release";
import { listSends, retrySend, sendReport } from "./send";
import { findReport, generateReport, listReports, reportFileName, type VersionReach } from "./store";

/** Whoever prepares and sends the report also sees versions not yet released; everyone else, released ones. */
const reachOf = (req: Request): VersionReach => ({ releasedOnly: !can(signedInUser(req), "sendReport") });

export function reportRoutes(db: Db, mailer: Mailer, logger: Logger): Router {
  const router = Router();

  router.get("/reports", allow("readReport"), (req, res) => {
    const period = typeof req.query.period === "string" && req.query.period ? req.query.period : undefined;
    res.json({ reports: listReports(db, period, reachOf(req)) });
  });

  // today's figures are a draft: funders read what was released to them
  router.get("/reports/:period/preview", allow("sendReport"), (req, res) => {
    res.json({ report: buildReportData(db, reportPeriod(req.params.period).id) });
  });

  router.post("/reports/:period", allow("sendReport"), async (req, res) => {
    const { includeActions } = parseWith(generateReportSchema, req.body ?? {}, "The report version");
    const stored = await generateReport(db, reportPeriod(req.params.period).id, { userId: signedInUser(req).id, includeActions });
    const { data: _data, pdf: _pdf, ...version } = stored;
    res.status(201).json({ report: version });
  });

  router.get("/reports/:period/notes", allow("readReport"), (req, res) => {
    const period = reportPeriod(req.params.period).id;
    res.json({ period, actions: readQuarterNotes(db, period) });
  });

  router.put("/reports/:period/notes", allow("sendReport"), (req, res) => {
    const period = reportPeriod(req.params.period).id;
    const { actions } = parseWith(quarterNotesSchema, req.body, "The note");
    saveQuarterNotes(db, period, actions, signedInUser(req).id);
    res.json({ period, actions: readQuarterNotes(db, period) });
  });

  router.get("/reports/:id/data", allow("readReport"), (req, res) => {
    const { pdf: _pdf, data, ...version } = findReport(db, parseId(req.params.id), reachOf(req));
    res.json({ report: version, data });
  });

  router.get("/reports/:id/pdf", allow("readReport"), (req, res) => {
    const report = findReport(db, parseId(req.params.id), reachOf(req));
    // ?inline=1 shows the same bytes inside the page (the preview before sending); otherwise a download
    const inline = req.query.inline === "1";
    res.attachment(reportFileName(report.period, report.version));
    // Express writes the file name; the preview shows the bytes in the page instead of saving them
    if (inline) res.set("Content-Disposition", res.get("Content-Disposition")!.replace(/^attachment/, "inline"));
    res.type("application/pdf").set("Cache-Control", "private, no-store").send(report.pdf);
  });

  router.get("/reports/:id/csv", allow("readReport"), (req, res) => {
    const report = findReport(db, parseId(req.params.id), reachOf(req));
    res
      .attachment(reportFileName(report.period, report.version).replace(/\.pdf$/, ".csv"))
      .type("text/csv; charset=utf-8")
      .send(reportCsv(report.data));
  });

  router.post("/reports/:id/release", allow("sendReport"), async (req, res) => {
    const outcome = await releaseReport(db, mailer, parseId(req.params.id), {
      userId: signedInUser(req).id,
      reportUrl: (period) => `${req.protocol}://${req.get("host")}/report?period=${encodeURIComponent(period)}`,
    });
    res.json(outcome);
  });

  router.post("/reports/:id/send", allow("sendReport"), async (req, res) => {
    const { extraRecipients, coverNote } = parseWith(sendReportSchema, req.body ?? {}, "The send");
    const userId = signedInUser(req).id;
    const started = Date.now();
    const send = await sendReport(db, mailer, parseId(req.params.id), { userId, extraRecipients, coverNote });
    logReportSend(logger, send, userId, Date.now() - started);
    res.status(201).json({ send });
  });

  router.get("/report-sends", allow("sendReport"), (_req, res) => {
    res.json({ sends: listSends(db) });
  });

  router.post("/report-sends/:id/retry", allow("sendReport"), async (req, res) => {
    const userId = signedInUser(req).id;
    const started = Date.now();
    const send = await retrySend(db, mailer, parseId(req.params.id), userId);
    logReportSend(logger, send, userId, Date.now() - started);
    res.json({ send });
  });

  return router;
}
