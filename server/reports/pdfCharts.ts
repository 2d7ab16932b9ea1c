// Vector charts for the funder report PDF, drawn with pdfkit paths so they stay sharp when printed.
// Every chart also states its numbers in text, so a reader without colour vision (or a screen reader on the
// extracted text) loses nothing.
import { quarterLabel } from "../../shared/period";
import type { ErrorRow, RateFigure, TrendPoint } from "../../shared/schemas/report";
import { formatPercent } from "./figures";
import { colours, FONT, type Doc, type TextOptions } from "./pdfStyle";

export interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

function label(doc: Doc, text: string, x: number, y: number, options: TextOptions & { size?: number; colour?: string } = {}) {
  const { size = 7.5, colour = colours.muted, ...rest } = options;
  doc
    .font(FONT)
    .fontSize(size)
    .fillColor(colour)
    .text(text, x, y, { lineBreak: false, ...rest });
}

/**
 * Pass rate per quarter: the rate as a line with dots, its 95 % interval as a band, the p-chart's 3-sigma
 * limits as short dashes per quarter and the centre as a dotted line. Hidden quarters leave a gap.
 */
export function drawTrendChart(doc: Doc, box: Box, points: TrendPoint[], centre: number | null, highlighted: string[]) {
  const plot = { x: box.x + 34, y: box.y + 6, width: box.width - 44, height: box.height - 40 };
  const step = plot.width / Math.max(points.length, 1);
  const xAt = (i: number) => plot.x + step * (i + 0.5);
  const yAt = (share: number) => plot.y + plot.height * (1 - share);

  // period being reported on
  points.forEach((point, i) => {
    if (highlighted.includes(point.quarter)) doc.rect(plot.x + step * i, plot.y, step, plot.height).fill(colours.highlight);
  });

  // grid and axis labels
  for (const share of [0, 0.25, 0.5, 0.75, 1]) {
    doc
      .moveTo(plot.x, yAt(share))
      .lineTo(plot.x + plot.width, yAt(share))
      .lineWidth(0.4)
      .strokeColor(colours.line)
      .stroke();
    label(doc, `${share * 100} %`, box.x, yAt(share) - 3.5, { width: 28, align: "right" });
  }
  points.forEach((point, i) => {
    label(doc, quarterLabel(point.quarter), xAt(i) - step / 2, plot.y + plot.height + 5, { width: step, align: "center" });
    if (point.passRate.value === null) {
      label(doc, point.passRate.text, xAt(i) - step / 2, plot.y + plot.height - 12, { width: step, align: "center", size: 6.5 });
    }
  });

  // runs of consecutive shown quarters
  const runs: number[][] = [];
  points.forEach((point, i) => {
    if (point.passRate.value === null) return;
    const last = runs[runs.length - 1];
    if (last && last[last.length - 1] === i - 1) last.push(i);
    else runs.push([i]);
  });

  for (const run of runs) {
    const high = run.map((i) => [xAt(i), yAt(points[i].passRate.high!)] as const);
    const low = run.map((i) => [xAt(i), yAt(points[i].passRate.low!)] as const).reverse();
    if (run.length === 1) {
      const [i] = run;
      doc.rect(xAt(i) - 5, yAt(points[i].passRate.high!), 10, yAt(points[i].passRate.low!) - yAt(points[i].passRate.high!)).fill(colours.band);
      continue;
    }
    doc.moveTo(high[0][0], high[0][1]);
    for (const [x, y] of [...high.slice(1), ...low]) doc.lineTo(x, y);
    doc.closePath().fill(colours.band);
  }

  if (centre !== null) {
    doc
      .moveTo(plot.x, yAt(centre))
      .lineTo(plot.x + plot.width, yAt(centre))
      .lineWidth(0.7)
      .dash(1.5, { space: 2 })
      .strokeColor(colours.muted)
      .stroke()
      .undash();
  }
  points.forEach((point, i) => {
    if (point.lcl === null || point.ucl === null) return;
    for (const limit of [point.lcl, point.ucl]) {
      doc
        .moveTo(xAt(i) - step * 0.32, yAt(limit))
        .lineTo(xAt(i) + step * 0.32, yAt(limit))
        .lineWidth(0.8)
        .dash(3, { space: 2 })
        .strokeColor(colours.limit)
        .stroke()
        .undash();
    }
  });

  for (const run of runs) {
    doc.moveTo(xAt(run[0]), yAt(points[run[0]].passRate.value!));
    for (const i of run.slice(1)) doc.lineTo(xAt(i), yAt(points[i].passRate.value!));
    doc.lineWidth(1.6).strokeColor(colours.brand).stroke();
  }
  points.forEach((point, i) => {
    if (point.passRate.value === null) return;
    doc.circle(xAt(i), yAt(point.passRate.value), 2.6).fill(colours.brand);
    if (point.outside) doc.circle(xAt(i), yAt(point.passRate.value), 5).lineWidth(1.2).strokeColor(colours.accentDark).stroke();
  });

  // legend
  const legendY = box.y + box.height - 12;
  let x = plot.x;
  doc
    .moveTo(x, legendY + 3)
    .lineTo(x + 14, legendY + 3)
    .lineWidth(1.6)
    .strokeColor(colours.brand)
    .stroke();
  label(doc, "pass rate", x + 18, legendY);
  x += 62;
  doc.rect(x, legendY - 1, 14, 8).fill(colours.band);
  label(doc, "95 % interval", x + 18, legendY);
  x += 76;
  doc
    .moveTo(x, legendY + 3)
    .lineTo(x + 14, legendY + 3)
    .lineWidth(0.8)
    .dash(3, { space: 2 })
    .strokeColor(colours.limit)
    .stroke()
    .undash();
  label(doc, "control limits (3 sigma)", x + 18, legendY);
  x += 110;
  doc
    .moveTo(x, legendY + 3)
    .lineTo(x + 14, legendY + 3)
    .lineWidth(0.7)
    .dash(1.5, { space: 2 })
    .strokeColor(colours.muted)
    .stroke()
    .undash();
  label(doc, "eight-quarter average", x + 18, legendY);
  x += 100;
  doc.rect(x, legendY - 1, 14, 8).fill(colours.highlight);
  label(doc, "this report", x + 18, legendY);
}

/** Errors as horizontal bars, largest first, with count, share and running share in text beside each bar. */
export function drawErrorBars(doc: Doc, box: Box, rows: ErrorRow[]): number {
  const rowHeight = 17;
  const labelWidth = 200;
  const barX = box.x + labelWidth + 8;
  const barWidth = box.width - labelWidth - 8 - 130;
  const max = Math.max(1, ...rows.map((r) => r.count.value ?? 0));
  label(doc, "attempts", barX, box.y, { size: 7 });
  label(doc, "share of errors · running total", box.x + box.width - 122, box.y, { size: 7, width: 122, align: "right" });
  let y = box.y + 12;
  for (const row of rows) {
    label(doc, row.label, box.x, y + 3, { size: 8, colour: colours.ink, width: labelWidth, ellipsis: true });
    if (row.count.value !== null) {
      const length = Math.max(1, (row.count.value / max) * barWidth);
      doc.rect(barX, y + 2, length, rowHeight - 6).fill(colours.brandSoft);
      label(doc, row.count.text, barX + length + 4, y + 3, { size: 8, colour: colours.ink });
    } else {
      doc
        .rect(barX, y + 2, barWidth, rowHeight - 6)
        .lineWidth(0.5)
        .dash(2, { space: 2 })
        .strokeColor(colours.line)
        .stroke()
        .undash();
      label(doc, row.count.text, barX + 4, y + 3, { size: 7.5 });
    }
    const share = row.share === null ? "–" : formatPercent(row.share);
    const running = row.cumulativeShare === null ? "–" : formatPercent(row.cumulativeShare);
    label(doc, `${share} · ${running}`, box.x + box.width - 122, y + 3, { size: 8, colour: colours.ink, width: 122, align: "right" });
    y += rowHeight;
  }
  return y - box.y;
}

export interface RateBar {
  label: string;
  rate: RateFigure;
  colour?: string;
}

/** Rates on a 0–100 % scale, each with its 95 % interval as a whisker and the figures written at the end. */
export function drawRateBars(doc: Doc, box: Box, bars: RateBar[]): number {
  const rowHeight = 22;
  const labelWidth = 150;
  const scaleX = box.x + labelWidth + 8;
  const scaleWidth = box.width - labelWidth - 8 - 150;
  const xAt = (share: number) => scaleX + share * scaleWidth;
  let y = box.y;
  for (const share of [0, 0.5, 1]) {
    label(doc, `${share * 100} %`, xAt(share) - 15, y, { size: 6.5, width: 30, align: "center" });
  }
  y += 10;
  for (const share of [0, 0.5, 1]) {
    doc
      .moveTo(xAt(share), y)
      .lineTo(xAt(share), y + bars.length * rowHeight)
      .lineWidth(0.4)
      .strokeColor(colours.line)
      .stroke();
  }
  for (const bar of bars) {
    label(doc, bar.label, box.x, y + 6, { size: 8, colour: colours.ink, width: labelWidth, ellipsis: true });
    const rate = bar.rate;
    if (rate.value !== null && rate.low !== null && rate.high !== null) {
      doc.rect(scaleX, y + 4, Math.max(0.5, rate.value * scaleWidth), rowHeight - 8).fill(bar.colour ?? colours.brandSoft);
      const mid = y + rowHeight / 2;
      doc.moveTo(xAt(rate.low), mid).lineTo(xAt(rate.high), mid).lineWidth(1).strokeColor(colours.ink).stroke();
      for (const end of [rate.low, rate.high])
        doc
          .moveTo(xAt(end), mid - 4)
          .lineTo(xAt(end), mid + 4)
          .stroke();
      label(doc, `${rate.text}  (${rate.intervalText})`, scaleX + scaleWidth + 10, y + 6, { size: 8, colour: colours.ink });
    } else {
      label(doc, rate.text, scaleX + scaleWidth + 10, y + 6, { size: 8 });
    }
    y += rowHeight;
  }
  return y - box.y;
}
