// How each column of the attempt list looks: its header (words from shared/vocabulary) and its cell. The
// server sorts by the same keys; the CSV export is written by the server with the same words.
import type { ReactNode } from "react";
import { Link } from "react-router";
import type { AttemptRow } from "../../../shared/schemas/insight";
import type { LengthUnit } from "../../../shared/units";
import { attemptFieldNames, errorLabels, errorShortNames, feedbackNames, patientTypeNames, resultNames } from "../../../shared/vocabulary";
import { TargetBadge } from "../../components/TargetBadge";
import type { AttemptColumnKey } from "./attemptListState";
import { formatRecordedDateTime } from "../../lib/formatting";

export interface AttemptColumn {
  key: AttemptColumnKey;
  header: string;
  cell: (a: AttemptRow) => ReactNode;
  /** Figures sit right, in tabular digits. */
  numeric?: boolean;
  /** Words for the phone sort menu; figures default to lowest/highest first, text to A to Z. */
  sortLabels?: { asc: string; desc: string };
}

const muted = (text: string) => <span className="text-muted">{text}</span>;
const whole = (value: number) => Math.round(value).toString();

export function ResultBadge({ passed }: { passed: boolean }) {
  return <TargetBadge status={passed ? "on_target" : "too_low"} label={passed ? resultNames.passed : resultNames.notPassed} />;
}

/** Short names, full labels on hover; `none` where there is no header to say what "None" is about. */
export function ErrorNames({ errors, none = "None" }: { errors: AttemptRow["errors"]; none?: string }) {
  if (errors.length === 0) return muted(none);
  return <span title={errors.map((e) => errorLabels[e]).join("; ")}>{errors.map((e) => errorShortNames[e]).join(", ")}</span>;
}

export function attemptColumns(unit: LengthUnit, formatLength: (mm: number) => string): Record<AttemptColumnKey, AttemptColumn> {
  const words = attemptFieldNames;
  return {
    startedAt: {
      key: "startedAt",
      header: words.startedAt,
      cell: (a) => formatRecordedDateTime(a.startedAt),
      sortLabels: { asc: "oldest first", desc: "newest first" },
    },
    learner: { key: "learner", header: words.learner, cell: (a) => <span className="font-mono">{a.learner}</span> },
    class: {
      key: "class",
      header: words.class,
      cell: (a) => (
        <Link to={`/classes/${encodeURIComponent(a.classId)}`} className="text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
          {a.classId}
        </Link>
      ),
    },
    site: { key: "site", header: words.site, cell: (a) => a.site?.code ?? muted("–") },
    instructor: { key: "instructor", header: words.instructor, cell: (a) => a.instructor?.code ?? muted("–") },
    manikin: { key: "manikin", header: words.manikin, cell: (a) => a.manikin?.assetId ?? muted("not recorded") },
    profile: { key: "profile", header: words.profile, cell: (a) => patientTypeNames[a.profile] },
    feedback: { key: "feedback", header: words.feedback, cell: (a) => feedbackNames[a.feedback] },
    passed: {
      key: "passed",
      header: words.passed,
      cell: (a) => <ResultBadge passed={a.passed} />,
      sortLabels: { asc: "not passed first", desc: "passed first" },
    },
    instructorResult: {
      key: "instructorResult",
      header: words.instructorResult,
      cell: (a) => (a.instructorResult === null ? muted("not recorded") : a.instructorResult === "pass" ? resultNames.passed : resultNames.notPassed),
      sortLabels: { asc: "not passed first", desc: "passed first" },
    },
    errors: {
      key: "errors",
      header: words.errors,
      cell: (a) => <ErrorNames errors={a.errors} />,
      sortLabels: { asc: "none first", desc: "by first error, none last" },
    },
    score: { key: "score", header: words.score, cell: (a) => whole(a.score), numeric: true },
    stream: { key: "stream", header: words.stream, cell: (a) => (a.hasStream ? "Yes" : muted("No")), sortLabels: { asc: "without first", desc: "with first" } },
    depth: { key: "depth", header: `${words.depth} (${unit})`, cell: (a) => formatLength(a.metrics.depthMm), numeric: true },
    depthOk: { key: "depthOk", header: words.depthOk, cell: (a) => whole(a.metrics.depthOkPct), numeric: true },
    rate: { key: "rate", header: words.rate, cell: (a) => whole(a.metrics.rateCpm), numeric: true },
    rateOk: { key: "rateOk", header: words.rateOk, cell: (a) => whole(a.metrics.rateOkPct), numeric: true },
    recoilOk: { key: "recoilOk", header: words.recoilOk, cell: (a) => whole(a.metrics.recoilOkPct), numeric: true },
    handsOn: { key: "handsOn", header: words.handsOn, cell: (a) => whole(a.metrics.handsOnPct), numeric: true },
    longestPause: { key: "longestPause", header: words.longestPause, cell: (a) => a.metrics.longestPauseS.toFixed(1), numeric: true },
  };
}
