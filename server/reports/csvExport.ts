// A stored report's figures as CSV: one row per figure, with the value (empty when hidden) and the text the
// report shows. Only what the report already shows goes in; hidden figures stay hidden.
import type { CountFigure, PerHundredFigure, RateFigure, ReportData } from "../../shared/schemas/report";
import { SPREADSHEET_CSV, toCsv, type CsvCell } from "../../shared/csv";

type Row = [section: string, item: string, value: CsvCell, low: CsvCell, high: CsvCell, shown: string];

const round = (value: number | null, digits = 4) => (value === null ? null : Number(value.toFixed(digits)));
const count = (section: string, item: string, f: CountFigure): Row => [section, item, f.value, null, null, f.text];
const rate = (section: string, item: string, f: RateFigure): Row => [
  section,
  item,
  round(f.value),
  round(f.low),
  round(f.high),
  f.intervalText ? `${f.text} (${f.intervalText})` : f.text,
];
const perHundred = (section: string, item: string, f: PerHundredFigure): Row => [section, item, round(f.value, 1), null, null, f.text];

export function reportCsv(data: ReportData): string {
  const rows: Row[] = [
    count("reach", "classes", data.reach.classes),
    count("reach", "learners", data.reach.learners),
    count("reach", "measured attempts", data.reach.attempts),
    count("reach", "instructors", data.reach.instructors),
    count("reach", "sites", data.reach.sites),
    ...data.reach.byCourse.flatMap((c) => [
      count("reach by course", `${c.label}: classes`, c.classes),
      count("reach by course", `${c.label}: learners`, c.learners),
    ]),
    rate("pass rate", `measured pass rate ${data.period}`, data.passRate),
    ...data.comparisons.map((c) => rate("pass rate", `${c.label} (${c.period})`, c.passRate)),
    ...data.trend.points.map((p) => rate("trend", p.quarter, p.passRate)),
    ...data.byPatientType.map((g) => rate("by patient type", g.label, g.passRate)),
    ...data.errors.rows.map((r) => count("errors", r.label, r.count)),
    rate("live display", data.feedback.live.label, data.feedback.live.passRate),
    rate("live display", data.feedback.hidden.label, data.feedback.hidden.passRate),
    count("agreement", "attempts with an instructor's judgement", data.agreement.pairs),
    ["agreement", "Cohen's kappa", round(data.agreement.kappa, 3), null, null, data.agreement.kappaText],
    rate("agreement", "recorded as completed", data.agreement.completionRate),
    count("equipment", "manikins used", data.equipment.manikinsUsed),
    count("equipment", "compressions", data.equipment.compressions),
    perHundred("equipment", "lungs replaced per 100 learners", data.equipment.lungsPer100Learners),
    perHundred("equipment", "mouthpiece cleans per 100 learners", data.equipment.mouthpiecesPer100Learners),
    perHundred("equipment", "batteries replaced per 100 learners", data.equipment.batteriesPer100Learners),
    count("equipment", "services", data.equipment.services),
    count("equipment", "faults", data.equipment.faults),
  ];
  return toCsv(["section", "item", "value", "interval_low", "interval_high", "as_shown"], rows, SPREADSHEET_CSV);
}
