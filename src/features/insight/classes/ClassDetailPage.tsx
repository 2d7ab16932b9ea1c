// One class: its log row (what the instructor recorded, consumables) and every attempt measured in it, each
// linking to the attempt's own page. Instructors may open their own classes only; the server answers
// anyone else's as missing.
import { useQuery } from "@tanstack/react-query";
import { Link, useLocation, useParams } from "react-router";
import type { AttemptRow, ClassDetailAnswer } from "../../../../shared/schemas/insight";
import { ApiError } from "../../../api/http";
import { DataTable, type Column } from "../../../components/DataTable";
import { PageHeader } from "../../../components/PageHeader";
import { SafetyNote } from "../../../components/SafetyNote";
import { EmptyState } from "../../../components/States";
import { attemptHref } from "../../attempts/returnPath";
import { useCan } from "../../auth/useCan";
import { formatCount, formatPercent, formatScore, roundTo } from "../format";
import { formatDay, formatRecordedClock } from "../../../lib/formatting";
import { quarterLabel } from "../../../../shared/period";
import { QueryStatus } from "../QueryStatus";
import { RateText } from "../RateText";
import { insightQueries } from "../queries";
import { useLengthUnit } from "../../../lib/useLengthUnit";
import { courseTypeNames, dimensionNames, errorLabels, errorShortNames, feedbackNames, patientTypeNames } from "../../../../shared/vocabulary";

type ClassAttempt = ClassDetailAnswer["attempts"][number];
type Measured = Pick<AttemptRow["metrics"], "depthMm" | "rateCpm">;

export default function ClassDetailPage() {
  const { id = "" } = useParams();
  const ownClassesOnly = !useCan("readAttempts", "any");
  const query = useQuery(insightQueries.classDetail(id));
  return (
    <QueryStatus
      query={query}
      loadingLabel={`Loading class ${id}…`}
      errorTitle="This class could not be loaded"
      renderError={(error) =>
        error instanceof ApiError && (error.status === 404 || error.status === 422) ? (
          <>
            <PageHeader title={ownClassesOnly ? "Class not found or not yours" : "Class not found"} />
            <EmptyState
              title={`Class “${id}” cannot be shown`}
              action={
                <Link
                  to={ownClassesOnly ? "/my-standing" : "/instructors"}
                  className="font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900"
                >
                  {ownClassesOnly ? "Go to your classes" : "Go to the instructors"}
                </Link>
              }
            >
              {ownClassesOnly
                ? "No class has this id, or it was taught by another instructor. Instructors can open their own classes only."
                : "No class has this id. The link may be old or mistyped."}
            </EmptyState>
          </>
        ) : null
      }
    >
      {(answer) => <ClassContent answer={answer} backTo={ownClassesOnly ? "standing" : "instructor"} />}
    </QueryStatus>
  );
}

function Fact({ label, wide = false, children }: { label: string; wide?: boolean; children: React.ReactNode }) {
  return (
    <div className={wide ? "col-span-2 flex flex-col" : "flex flex-col"}>
      <dt className="text-caption font-semibold text-muted">{label}</dt>
      <dd className="tabular-nums">{children}</dd>
    </div>
  );
}

const notRecorded = <span className="text-muted">not recorded</span>;

export function ClassContent({ answer, backTo }: { answer: ClassDetailAnswer; backTo: "standing" | "instructor" }) {
  const c = answer.class;
  const measured = useQuery(insightQueries.classAttempts(c.id, c.quarter));
  const metrics = new Map<string, Measured>((measured.data?.attempts ?? []).map((a) => [a.id, a.metrics]));
  const { unit, formatLength, fromMm } = useLengthUnit();
  const location = useLocation();
  const here = `${location.pathname}${location.search}`;
  const back =
    backTo === "standing"
      ? { to: `/my-standing?quarter=${c.quarter}`, label: "My standing" }
      : { to: `/instructors/${c.instructor.id}?quarter=${c.quarter}`, label: `${c.instructor.code} · ${c.instructor.name}` };

  const columns: Column<ClassAttempt>[] = [
    {
      key: "id",
      header: "Attempt",
      value: (a) => a.id,
      render: (a) => (
        <span className="flex flex-col leading-tight">
          <Link to={attemptHref(a.id, here)} className="font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
            {a.id}
          </Link>
          <span className="text-caption text-muted">started {formatRecordedClock(a.startedAt)}</span>
        </span>
      ),
      primary: true,
    },
    { key: "learner", header: "Learner", value: (a) => a.learner },
    // a class usually uses one manikin type (then the course says it); all-ages classes mix them
    ...(new Set(answer.attempts.map((a) => a.profile)).size > 1
      ? [{ key: "profile", header: dimensionNames.patientType, value: (a: ClassAttempt) => patientTypeNames[a.profile] }]
      : []),
    { key: "feedback", header: dimensionNames.feedback, value: (a) => feedbackNames[a.feedback] },
    { key: "score", header: "Score", value: (a) => roundTo(a.score, 1), render: (a) => formatScore(a.score), align: "right" },
    { key: "passed", header: "Measured", value: (a) => (a.passed ? "Passed" : "Not passed"), render: (a) => <PassMark passed={a.passed} /> },
    {
      key: "instructor",
      header: "Instructor said",
      value: (a) => (a.instructorResult === null ? "" : a.instructorResult === "pass" ? "Passed" : "Not passed"),
      render: (a) => (a.instructorResult === null ? notRecorded : <PassMark passed={a.instructorResult === "pass"} />),
    },
    {
      key: "errors",
      header: "Errors",
      value: (a) => (a.errors.length === 0 ? "None" : a.errors.map((e) => errorLabels[e]).join("; ")),
      render: (a) =>
        a.errors.length === 0 ? (
          <span className="text-muted">None</span>
        ) : (
          <span className="block min-w-32" title={a.errors.map((e) => errorLabels[e]).join("; ")}>
            {a.errors.map((e) => errorShortNames[e]).join(", ")}
          </span>
        ),
      wrap: true,
    },
    {
      key: "depth",
      header: `Depth (${unit})`,
      value: (a) => {
        const depth = metrics.get(a.id)?.depthMm;
        return depth === undefined ? null : roundTo(fromMm(depth), unit === "in" ? 2 : 1);
      },
      render: (a) => (metrics.has(a.id) ? formatLength(metrics.get(a.id)!.depthMm) : "–"),
      align: "right",
    },
    { key: "rate", header: "Rate (/min)", value: (a) => roundTo(metrics.get(a.id)?.rateCpm, 0), align: "right" },
  ];

  const recordedShare = c.learners === 0 ? null : c.passed / c.learners;
  return (
    <div className="flex flex-col gap-6">
      <Link
        to={back.to}
        className="inline-flex min-h-9 items-center gap-1 self-start font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900"
      >
        <span aria-hidden="true">←</span> {back.label}
      </Link>
      <PageHeader
        title={`Class ${c.id}`}
        description={`${courseTypeNames[c.course] ?? c.course} course on ${formatDay(c.date)} at ${c.site.code}, taught by ${c.instructor.code} · ${c.instructor.name}.`}
      />
      <section aria-labelledby="log-heading" className="rounded-card border border-line bg-surface p-4 shadow-card">
        <h2 id="log-heading" className="mb-3 text-title">
          Class log
        </h2>
        <dl className="grid grid-cols-2 gap-x-6 gap-y-3 sm:grid-cols-3 lg:grid-cols-5">
          <Fact label="Date">
            {formatDay(c.date)} ({quarterLabel(c.quarter)})
          </Fact>
          <Fact label="Site">{c.site.code}</Fact>
          <Fact label="Course">{courseTypeNames[c.course] ?? c.course}</Fact>
          <Fact label="Learners">{formatCount(c.learners)}</Fact>
          <Fact label="Recorded completions">
            {formatCount(c.passed)} of {formatCount(c.learners)} ({formatPercent(recordedShare)})
          </Fact>
          <Fact label="Measured pass rate" wide>
            <RateText rate={answer.passRate} stacked={false} />
          </Fact>
          <Fact label="Manikins" wide>
            {/* a list may wrap between asset ids, never at the hyphen inside one */}
            {c.manikins.length
              ? c.manikins.map((assetId, i) => (
                  <span key={assetId}>
                    {i > 0 && ", "}
                    <span className="whitespace-nowrap">{assetId}</span>
                  </span>
                ))
              : notRecorded}
          </Fact>
          <Fact label="Lungs replaced">{c.lungsReplaced ?? notRecorded}</Fact>
          <Fact label="Mouthpieces cleaned">{c.mouthpiecesCleaned ?? notRecorded}</Fact>
          <Fact label="Batteries replaced">{c.batteriesReplaced ?? notRecorded}</Fact>
        </dl>
        <p className="mt-3 text-small text-muted">
          Recorded completions count learners the instructor signed off; the measured pass rate counts manikin attempts that met every target (a learner may
          make several attempts).
        </p>
      </section>
      <section aria-labelledby="attempts-heading" className="flex flex-col gap-3">
        <h2 id="attempts-heading" className="text-title">
          Attempts ({formatCount(answer.attempts.length)})
        </h2>
        {measured.isError && <p className="text-small text-muted">Depth and rate could not be loaded; the other columns are complete.</p>}
        {answer.attempts.length > 0 && (
          <p className="text-small">
            <Link
              to={`/attempts?${new URLSearchParams({ quarter: c.quarter, class: c.id }).toString()}`}
              className="font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900"
            >
              Open this class’s attempts in the attempts list
            </Link>{" "}
            <span className="text-muted">to choose columns, sort them or export every figure.</span>
          </p>
        )}
        <DataTable
          caption="Attempts"
          columns={columns}
          rows={answer.attempts}
          rowKey={(a) => a.id}
          exportFileName={`class-${c.id}-attempts`}
          emptyMessage="No manikin attempts were imported for this class."
        />
        <SafetyNote compact />
      </section>
    </div>
  );
}

function PassMark({ passed }: { passed: boolean }) {
  return (
    <span className={`inline-flex items-center gap-1 font-medium ${passed ? "text-on-target-text" : "text-too-high-text"}`}>
      <span aria-hidden="true">{passed ? "✓" : "✗"}</span>
      {passed ? "Passed" : "Not passed"}
    </span>
  );
}
