// The funder report as a PDF: A4, Quarterbeat's own layout, Roboto Flex embedded, charts as vector paths.
// The same data and creation time give the same bytes (pdfkit's creation date is set from the report).
import PDFDocument from "pdfkit";
import type { CountFigure, ReportData } from "../../shared/schemas/report";
import { markGeometry } from "../../shared/markGeometry";
import { trendBaselineText } from "../../shared/reportTrend";
import { drawErrorBars, drawRateBars, drawTrendChart } from "./pdfCharts";
import { colours, FONT, registerFonts, textRuns, type Doc } from "./pdfStyle";
import { dimensionNames, figureNames, retentionFigureName } from "../../shared/vocabulary";
import { writtenDate } from "../../shared/writtenDate";

export interface PdfMeta {
  version: number;
  createdAt: Date;
}

const PAGE = { width: 595.28, height: 841.89 };
const MARGIN = { left: 48, right: 48, top: 48, bottom: 60 };
const CONTENT_WIDTH = PAGE.width - MARGIN.left - MARGIN.right;

export function renderReportPdf(data: ReportData, meta: PdfMeta): Promise<Buffer> {
  const doc = new PDFDocument({
    size: "A4",
    margins: MARGIN,
    bufferPages: true,
    info: {
      Title: `${data.networkName}: training quality report ${data.period}`,
      Author: "Quarterbeat",
      Subject: `Funder report for ${data.periodLabel}, version ${meta.version}`,
      Creator: "Quarterbeat",
      Producer: "Quarterbeat",
      CreationDate: meta.createdAt,
      ModDate: meta.createdAt,
    },
  });
  registerFonts(doc);
  doc.font(FONT);

  const chunks: Buffer[] = [];
  doc.on("data", (chunk: Buffer) => chunks.push(chunk));
  const finished = new Promise<Buffer>((resolve, reject) => {
    doc.on("end", () => resolve(Buffer.concat(chunks)));
    doc.on("error", reject);
  });

  const page = new PageFlow(doc);
  drawHeader(doc, data, meta);
  page.y = 104;
  drawTitle(page, data, meta);
  drawKeyFigures(page, data);
  drawPassRatePanel(page, data);
  drawNarrative(page, data);
  drawTrend(page, data);
  drawErrors(page, data);
  drawImprovementActions(page, data);
  drawFeedback(page, data);
  drawPatientTypes(page, data);
  drawCourses(page, data);
  drawAgreement(page, data);
  drawRetention(page, data);
  drawEquipment(page, data);
  drawMethods(page, data);
  drawFooters(doc, data, meta);

  doc.end();
  return finished;
}

/** Keeps track of where the next block goes and starts a new page when a block would not fit. */
class PageFlow {
  y = MARGIN.top;
  constructor(readonly doc: Doc) {}

  ensure(height: number) {
    if (this.y + height > PAGE.height - MARGIN.bottom) {
      this.doc.addPage();
      this.y = MARGIN.top;
    }
  }

  heading(text: string, blockHeight: number) {
    this.ensure(26 + blockHeight);
    const { doc } = this;
    doc.rect(MARGIN.left, this.y + 1, 3, 13).fill(colours.accent);
    doc
      .font(FONT)
      .fontSize(12.5)
      .fillColor(colours.brand)
      .text(text, MARGIN.left + 10, this.y, { lineBreak: false });
    this.y += 22;
  }

  paragraph(text: string, options: { size?: number; colour?: string; indent?: number; gapAfter?: number } = {}) {
    const { size = 9.5, colour = colours.ink, indent = 0, gapAfter = 6 } = options;
    const width = CONTENT_WIDTH - indent;
    this.doc.font(FONT).fontSize(size);
    const height = this.doc.heightOfString(text, { width, lineGap: 2 });
    this.ensure(height);
    this.doc.fillColor(colour).text(text, MARGIN.left + indent, this.y, { width, lineGap: 2 });
    this.y += height + gapAfter;
  }
}

/** The mark of shared/markGeometry.ts, scaled from its 32-unit grid into a `size` square at (x, y). */
function drawLogoMark(doc: Doc, x: number, y: number, size: number) {
  const g = markGeometry;
  doc.save();
  doc.translate(x, y).scale(size / g.size);
  doc.path(g.quarter).fill(colours.accent);
  for (const arc of g.arcs) doc.path(arc).lineWidth(g.arcWidth).lineCap("round").strokeColor("#E2E0F4").stroke();
  for (const [cx, cy] of g.nodes) doc.circle(cx, cy, g.nodeRadius).fill("#E2E0F4");
  doc.restore();
}

function writeRuns(doc: Doc, text: string, x: number, y: number, options: { width: number; size: number; colour: string; lineGap?: number }) {
  const runs = textRuns(text);
  runs.forEach((run, i) => {
    doc.font(run.font).fontSize(options.size).fillColor(options.colour);
    const continued = i < runs.length - 1;
    if (i === 0) doc.text(run.text, x, y, { width: options.width, lineGap: options.lineGap ?? 2, continued });
    else doc.text(run.text, { continued });
  });
  doc.font(FONT);
}

function drawHeader(doc: Doc, data: ReportData, meta: PdfMeta) {
  doc.rect(0, 0, PAGE.width, 84).fill(colours.brandDark);
  drawLogoMark(doc, MARGIN.left, 24, 34);
  doc
    .font(FONT)
    .fontSize(17)
    .fillColor("#FFFFFF")
    .text("Quarterbeat", MARGIN.left + 44, 25, { lineBreak: false });
  writeRuns(doc, data.networkName, MARGIN.left + 44, 47, { width: 260, size: 9, colour: "#C6C2EA" });
  const right = { width: 220, align: "right" as const, lineBreak: false };
  const rightX = PAGE.width - MARGIN.right - 220;
  doc.font(FONT).fontSize(9).fillColor("#C6C2EA").text(`Report for funders · version ${meta.version}`, rightX, 24, right);
  doc.fontSize(16).fillColor("#FFFFFF").text(data.period, rightX, 38, right);
  doc.rect(0, 84, PAGE.width, 4).fill(colours.accent);
}

function drawTitle(page: PageFlow, data: ReportData, meta: PdfMeta) {
  const { doc } = page;
  doc.font(FONT).fontSize(20).fillColor(colours.ink).text(`Training quality, ${data.periodLabel}`, MARGIN.left, page.y, { width: CONTENT_WIDTH });
  page.y += 28;
  const versions = data.methods.scoredUnderVersions;
  const scored = versions.length ? ` · scored under policy version ${versions.join(", ")}` : "";
  doc
    .fontSize(8.5)
    .fillColor(colours.muted)
    .text(
      `Period ${data.kind === "year" ? `${data.period} (${data.quarters.join(", ")})` : data.period} · generated ${writtenDate(meta.createdAt)}${scored}`,
      MARGIN.left,
      page.y,
      { width: CONTENT_WIDTH },
    );
  page.y += 22;
}

function drawKeyFigures(page: PageFlow, data: ReportData) {
  const { doc } = page;
  const tiles: [string, CountFigure][] = [
    ["classes", data.reach.classes],
    ["learners", data.reach.learners],
    ["measured attempts", data.reach.attempts],
    ["instructors", data.reach.instructors],
    ["sites", data.reach.sites],
  ];
  const gap = 8;
  const width = (CONTENT_WIDTH - gap * (tiles.length - 1)) / tiles.length;
  tiles.forEach(([name, figure], i) => {
    const x = MARGIN.left + i * (width + gap);
    doc.roundedRect(x, page.y, width, 50, 4).fill(colours.paper);
    const size = figure.hidden ? 10.5 : 19;
    doc
      .font(FONT)
      .fontSize(size)
      .fillColor(figure.hidden ? colours.muted : colours.brand)
      .text(figure.text, x + 9, page.y + (figure.hidden ? 14 : 8), {
        width: width - 14,
        lineBreak: false,
      });
    doc
      .fontSize(8)
      .fillColor(colours.muted)
      .text(name, x + 9, page.y + 34, { width: width - 14, lineBreak: false });
  });
  page.y += 64;
}

function drawPassRatePanel(page: PageFlow, data: ReportData) {
  const { doc } = page;
  const height = 92;
  const top = page.y;
  doc.rect(MARGIN.left, top, CONTENT_WIDTH, height).fill(colours.tint);
  doc.rect(MARGIN.left, top, 4, height).fill(colours.brand);
  const rate = data.passRate;
  doc
    .font(FONT)
    .fontSize(9)
    .fillColor(colours.muted)
    .text(figureNames.passRate, MARGIN.left + 16, top + 10, { lineBreak: false });
  doc
    .fontSize(rate.value === null ? 16 : 32)
    .fillColor(colours.ink)
    .text(rate.text, MARGIN.left + 16, top + 24, { lineBreak: false });
  const sub = rate.hidden ? "hidden to protect a small group" : rate.value === null ? "no measured attempts" : `95 % interval ${rate.intervalText}`;
  doc
    .fontSize(9)
    .fillColor(colours.ink)
    .text(sub, MARGIN.left + 16, top + 62, { lineBreak: false });
  doc
    .fontSize(7.5)
    .fillColor(colours.muted)
    .text(`of ${data.reach.attempts.text} measured attempts`, MARGIN.left + 16, top + 75, { lineBreak: false });

  const x = MARGIN.left + 200;
  const width = CONTENT_WIDTH - 212;
  doc
    .fontSize(9)
    .fillColor(colours.muted)
    .text("Compared with earlier periods", x, top + 10, { lineBreak: false });
  let y = top + 26;
  for (const comparison of data.comparisons) {
    doc.fontSize(9.5).fillColor(colours.ink);
    doc.text(comparison.text, x, y, { width, lineGap: 1 });
    y += doc.heightOfString(comparison.text, { width, lineGap: 1 }) + 6;
  }
  page.y = top + height + 18;
}

function drawNarrative(page: PageFlow, data: ReportData) {
  page.heading("In brief", 40);
  page.paragraph(data.narrative.join(" "), { size: 9.5, gapAfter: 12 });
}

function drawTrend(page: PageFlow, data: ReportData) {
  const height = 185;
  page.heading("Pass rate over the last eight quarters", height);
  drawTrendChart(page.doc, { x: MARGIN.left, y: page.y, width: CONTENT_WIDTH, height }, data.trend.points, data.trend.centre, data.quarters);
  page.y += height + 4;
  page.paragraph(
    "Each dot is one quarter's share of measured attempts that met the pass rule; the shaded band is its 95 % interval. " +
      "Dashes mark the 3-sigma control limits of a p-chart: a quarter outside them (ringed) differs by more than chance would explain. " +
      trendBaselineText(data.trend),
    { size: 7.5, colour: colours.muted, gapAfter: 14 },
  );
}

function drawErrors(page: PageFlow, data: ReportData) {
  const rows = data.errors.rows;
  page.heading("Most common errors", 14 + rows.length * 17);
  const used = drawErrorBars(page.doc, { x: MARGIN.left, y: page.y, width: CONTENT_WIDTH, height: 0 }, rows);
  page.y += used + 4;
  page.paragraph(`An attempt can show several errors. ${data.errors.attemptsWithErrors.text} attempts showed at least one.`, {
    size: 7.5,
    colour: colours.muted,
    gapAfter: 10,
  });

  const note = data.errors.actions.trim() || "The coordinator has not yet written what the network is doing about these errors.";
  const { doc } = page;
  doc.font(FONT).fontSize(9.5);
  const width = CONTENT_WIDTH - 28;
  const textHeight = doc.heightOfString(note, { width, lineGap: 2 });
  page.ensure(textHeight + 34);
  const top = page.y;
  doc.rect(MARGIN.left, top, CONTENT_WIDTH, textHeight + 30).fill(colours.highlight);
  doc.rect(MARGIN.left, top, 4, textHeight + 30).fill(colours.accent);
  doc
    .font(FONT)
    .fontSize(8)
    .fillColor(colours.accentDark)
    .text("What the network is doing about it", MARGIN.left + 14, top + 8, { lineBreak: false });
  writeRuns(doc, note, MARGIN.left + 14, top + 21, { width, size: 9.5, colour: colours.ink });
  page.y = top + textHeight + 30 + 18;
}

function drawImprovementActions(page: PageFlow, data: ReportData) {
  const actions = data.improvementActions;
  if (!actions) return;
  page.heading("Improvement actions", 15 * (Math.min(actions.length, 4) + 2) + 30);
  page.paragraph(
    actions.length === 0
      ? "No improvement action had started by the end of the period."
      : "What the network has changed to move one figure, where and from when, with how far each has got. Actions aimed at a single instructor are not listed.",
    { size: 9, gapAfter: 8 },
  );
  if (actions.length === 0) return;
  drawTable(
    page,
    [
      { title: "Action", width: 150 },
      { title: "Aim", width: 140 },
      { title: "Where", width: 80 },
      { title: "Start", width: 70 },
      { title: "Status", width: CONTENT_WIDTH - 440 },
    ],
    actions.map((a) => [a.title, a.aim, a.scope, writtenDate(a.startDate), a.status]),
  );
  page.paragraph("A change after an action started is not proof that the action caused it: other things change over time too.", {
    size: 7.5,
    colour: colours.muted,
    gapAfter: 14,
  });
}

function drawFeedback(page: PageFlow, data: ReportData) {
  const { live, hidden, verdict, differencePoints } = data.feedback;
  page.heading("With and without the live display", 60);
  const used = drawRateBars(page.doc, { x: MARGIN.left, y: page.y, width: CONTENT_WIDTH, height: 0 }, [
    { label: `${live.label} (${live.attempts.text})`, rate: live.passRate, colour: colours.brandSoft },
    { label: `${hidden.label} (${hidden.attempts.text})`, rate: hidden.passRate, colour: colours.line },
  ]);
  page.y += used + 4;
  const reading =
    verdict === null || differencePoints === null
      ? "One of the two groups is too small to compare."
      : verdict === "no clear change"
        ? "The gap is within what chance alone could give: no clear difference."
        : `Attempts with the display shown passed ${verdict === "up" ? "more" : "less"} often, by ${Math.abs(differencePoints).toFixed(1)} percentage points.`;
  page.paragraph(`Bars show the pass rate, whiskers its 95 % interval. ${reading}`, { size: 7.5, colour: colours.muted, gapAfter: 14 });
}

const TABLE_ROW_HEIGHT = 15;

interface Column {
  title: string;
  width: number;
  align?: "left" | "right";
}

/**
 * A table drawn by pdfkit's own table support: a muted header over a rule, rows shaded in turn, and cells
 * that wrap long text onto more lines (the row grows) instead of running into the next column.
 */
function drawTable(page: PageFlow, columns: Column[], rows: string[][]) {
  const { doc } = page;
  // Short tables stay on one page; a longer one continues on the next page by itself.
  page.ensure(TABLE_ROW_HEIGHT * (rows.length + 1));
  // An empty last column takes up any width left, so the rule and the shading run the full content width.
  const rest = CONTENT_WIDTH - columns.reduce((sum, column) => sum + column.width, 0);
  const filled = rest > 0.5 ? [...columns, { title: "", width: rest }] : columns;
  const cells = rest > 0.5 ? rows.map((row) => [...row, ""]) : rows;
  doc.font(FONT).fontSize(8.5);
  doc.table({
    position: { x: MARGIN.left, y: page.y },
    maxWidth: CONTENT_WIDTH,
    defaultStyle: { border: 0, padding: [4, 4, 1, 4], textColor: colours.ink },
    columnStyles: filled.map((column) => ({ width: column.width, align: { x: column.align ?? "left", y: "top" } })),
    rowStyles: (i: number) =>
      i === 0
        ? {
            minHeight: TABLE_ROW_HEIGHT,
            font: { size: 7.5 },
            textColor: colours.muted,
            padding: [3, 4, 2.5, 4],
            border: [0, 0, 0.6, 0],
            borderColor: colours.line,
          }
        : { minHeight: TABLE_ROW_HEIGHT, backgroundColor: i % 2 === 0 ? colours.paper : undefined },
    data: [filled.map((column) => column.title), ...cells],
  });
  page.y = doc.y + 14;
}

function drawPatientTypes(page: PageFlow, data: ReportData) {
  page.heading("Results by patient type", 15 * 4);
  drawTable(
    page,
    [
      { title: dimensionNames.patientType, width: 160 },
      { title: "Measured attempts", width: 110, align: "right" },
      { title: "Pass rate", width: 100, align: "right" },
      { title: "95 % interval", width: CONTENT_WIDTH - 370, align: "right" },
    ],
    data.byPatientType.map((g) => [g.label, g.attempts.text, g.passRate.text, g.passRate.intervalText || "–"]),
  );
}

function drawCourses(page: PageFlow, data: ReportData) {
  page.heading("Reach by course", 15 * 6);
  drawTable(
    page,
    [
      { title: "Course", width: 160 },
      { title: "Classes", width: 110, align: "right" },
      { title: "Learners", width: 100, align: "right" },
    ],
    [...data.reach.byCourse.map((c) => [c.label, c.classes.text, c.learners.text]), ["All courses", data.reach.classes.text, data.reach.learners.text]],
  );
}

function drawAgreement(page: PageFlow, data: ReportData) {
  const a = data.agreement;
  page.heading("Instructors' judgement and measured quality", 90);
  const used = drawRateBars(page.doc, { x: MARGIN.left, y: page.y, width: CONTENT_WIDTH, height: 0 }, [
    { label: "Recorded as completed by instructors", rate: a.completionRate, colour: colours.line },
    { label: "Passed on the manikin at least once", rate: a.everPassedRate, colour: colours.brandSoft },
    { label: "Attempts that met the pass rule", rate: a.objectivePassRate, colour: colours.brandSoft },
  ]);
  page.y += used + 6;
  const kappa =
    a.kappa !== null && a.observedAgreement !== null
      ? `On the ${a.pairs.text} attempts where the instructor also recorded pass or fail, instructor and measurement agreed on ` +
        `${(a.observedAgreement * 100).toFixed(1)} %; Cohen's kappa, which discounts agreement expected by chance, is ${a.kappaText}.`
      : a.pairs.hidden
        ? `Attempts with both an instructor's judgement and a measurement: ${a.pairs.text}; agreement is not shown.`
        : `Attempts with both an instructor's judgement and a measurement: ${a.pairs.text}.`;
  page.paragraph(kappa, { size: 9, gapAfter: 14 });
}

function drawRetention(page: PageFlow, data: ReportData) {
  if (!data.retention) return;
  const groups = [data.retention.firstTime, ...data.retention.returning];
  page.heading("Learners returning for recertification", 15 * (groups.length + 2) + 30);
  page.paragraph(
    "Learners come back under the same pseudonymous code. How often their first attempt in the new class met the pass rule, by months since their previous class, beside learners on their first course in the data. A learner back twice counts twice.",
    { size: 9, gapAfter: 8 },
  );
  drawTable(
    page,
    [
      { title: "Learners", width: 200 },
      { title: "Learner–class pairs", width: 110, align: "right" },
      { title: retentionFigureName, width: 100, align: "right" },
      { title: "95 % interval", width: CONTENT_WIDTH - 410, align: "right" },
    ],
    groups.map((g) => [g.label, g.learners.text, g.firstAttemptPassRate.text, g.firstAttemptPassRate.intervalText || "–"]),
  );
}

function drawEquipment(page: PageFlow, data: ReportData) {
  const e = data.equipment;
  page.heading("Equipment and consumables", 15 * 9);
  drawTable(
    page,
    [
      { title: "Item", width: 280 },
      { title: "This period", width: CONTENT_WIDTH - 280, align: "right" },
    ],
    [
      ["Training manikins used", e.manikinsUsed.text],
      ["Compressions recorded", e.compressions.text],
      ["Compressions per manikin used", e.compressionsPerManikin === null ? "–" : Math.round(e.compressionsPerManikin).toLocaleString("en-GB")],
      ["Lungs replaced per 100 learners", e.lungsPer100Learners.text],
      ["Mouthpiece cleans per 100 learners", e.mouthpiecesPer100Learners.text],
      ["Batteries replaced per 100 learners", e.batteriesPer100Learners.text],
      ["Manikin services", e.services.text],
      ["Faults reported", e.faults.text],
    ],
  );
}

function drawMethods(page: PageFlow, data: ReportData) {
  const { doc } = page;
  const m = data.methods;
  const inner = CONTENT_WIDTH - 28;
  const bandLines = m.bands.map((b) => `${b.label}: depth ${b.depth}, rate ${b.rate}, ${b.recoil}.`);
  const blocks: { title: string; text: string; size: number }[] = [
    {
      title: "How an attempt is scored",
      text:
        "Each compression on a training manikin is compared with the target band for the manikin's patient type " +
        `(current network policy, version ${data.policyVersion}): ${bandLines.join(" ")}`,
      size: 8.5,
    },
    { title: "Pass rule", text: `An attempt passes when all of these hold: ${m.passRule.join("; ")}. ${m.passRuleNote}`, size: 8.5 },
    {
      title: "Intervals and comparisons",
      text:
        "Pass rates carry a Wilson 95 % score interval. A change between periods, and the gap between live and hidden display, " +
        "is called up or down only when the 95 % interval of the difference (Newcombe's hybrid score method) excludes zero; " +
        'otherwise it reads "no clear change". Quarterly control limits are those of a p-chart (3 sigma).',
      size: 8.5,
    },
    { title: "Small numbers", text: m.suppressionNote, size: 8.5 },
    { title: "Guideline sources", text: m.sources.join(" "), size: 7.5 },
    { title: "Please note", text: m.safetyNote, size: 8.5 },
  ];
  const heights = blocks.map((b) => {
    doc.font(FONT).fontSize(b.size);
    return 12 + doc.heightOfString(b.text, { width: inner, lineGap: 1.5 }) + 8;
  });
  const total = 30 + heights.reduce((sum, h) => sum + h, 0);
  page.ensure(total + 10);
  const top = page.y;
  doc.roundedRect(MARGIN.left, top, CONTENT_WIDTH, total, 6).lineWidth(0.8).fillAndStroke(colours.tint, "#C6C2EA");
  doc
    .font(FONT)
    .fontSize(12)
    .fillColor(colours.brand)
    .text("How these figures are made", MARGIN.left + 14, top + 12, { lineBreak: false });
  let y = top + 34;
  blocks.forEach((block, i) => {
    doc
      .font(FONT)
      .fontSize(7.5)
      .fillColor(colours.accentDark)
      .text(block.title.toUpperCase(), MARGIN.left + 14, y, { lineBreak: false, characterSpacing: 0.6 });
    doc
      .fontSize(block.size)
      .fillColor(colours.ink)
      .text(block.text, MARGIN.left + 14, y + 12, { width: inner, lineGap: 1.5 });
    y += heights[i];
  });
  page.y = top + total + 12;
}

function drawFooters(doc: Doc, data: ReportData, meta: PdfMeta) {
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    // writing below the bottom margin would make pdfkit open a new page
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    const y = PAGE.height - 40;
    doc
      .moveTo(MARGIN.left, y - 6)
      .lineTo(PAGE.width - MARGIN.right, y - 6)
      .lineWidth(0.5)
      .strokeColor(colours.line)
      .stroke();
    doc.font(FONT).fontSize(7.5).fillColor(colours.muted);
    doc.text(`Quarterbeat · report for funders · ${data.period} · version ${meta.version} · generated ${writtenDate(meta.createdAt)}`, MARGIN.left, y, {
      width: CONTENT_WIDTH - 80,
      lineBreak: false,
    });
    doc.text(`Page ${i - range.start + 1} of ${range.count}`, PAGE.width - MARGIN.right - 80, y, { width: 80, align: "right", lineBreak: false });
    doc.page.margins.bottom = bottom;
  }
}
