// The overview's headline figures: what was measured, what instructors recorded, how far they agree, and
// the volume behind them. Hidden groups say "fewer than N attempts" instead of a number.
import type { OverviewAnswer } from "../../../../shared/schemas/insight";
import { StatCard, type StatChange } from "../../../components/StatCard";
import { formatCount, formatFixed, formatInterval, formatPercent, formatPoints, formatScore, kappaWords } from "../format";
import { rangeLabel } from "../../../../shared/period";
import { Suppressed } from "../Suppressed";

type Rate = OverviewAnswer["passRate"];

function intervalOf(rate: Rate) {
  if (rate.low === null || rate.high === null) return undefined;
  const [low, high] = formatInterval(rate.low, rate.high).split("–");
  return { low, high, label: "95 % interval" };
}

export function OverviewStats({ answer }: { answer: OverviewAnswer }) {
  const min = answer.suppressionMinCount;
  const hidden = <Suppressed minCount={min} className="text-lead font-semibold text-muted" />;
  const { passRate, recordedCompletion, agreement, passRateChange } = answer;

  const change: StatChange | undefined =
    passRateChange.absolute === null
      ? undefined
      : {
          value: passRateChange.absolute,
          text: formatPoints(passRateChange.absolute),
          comparedWith: `since ${rangeLabel(answer.previousPeriod)}`,
          better: "up",
          clear: passRateChange.verdict !== "no clear change",
        };
  const noComparison = passRateChange.previous.suppressed
    ? `${rangeLabel(answer.previousPeriod)} had fewer than ${min} attempts, so there is no comparison.`
    : passRateChange.previous.rate === null
      ? `No attempts in ${rangeLabel(answer.previousPeriod)} to compare with.`
      : null;

  return (
    <div className="flex flex-col gap-4">
      <div className="grid grid-cols-1 gap-4 sm:grid-cols-2 xl:grid-cols-3">
        <StatCard
          label="Measured pass rate"
          value={passRate.suppressed ? hidden : formatPercent(passRate.rate)}
          interval={intervalOf(passRate)}
          change={change}
          footnote={
            <>
              {passRate.n !== null && `${formatCount(passRate.successes)} of ${formatCount(passRate.n)} manikin attempts met every target.`}
              {noComparison && ` ${noComparison}`}
              {passRateChange.low !== null &&
                passRateChange.high !== null &&
                ` The change's 95 % interval runs from ${formatPoints(passRateChange.low)} to ${formatPoints(passRateChange.high)}${passRateChange.verdict === "no clear change" ? ", so it may be chance." : "."}`}
            </>
          }
        />
        <StatCard
          label="Instructor-recorded completion"
          value={recordedCompletion.suppressed ? hidden : formatPercent(recordedCompletion.rate)}
          interval={intervalOf(recordedCompletion)}
          footnote={
            recordedCompletion.n !== null
              ? `${formatCount(recordedCompletion.successes)} of ${formatCount(recordedCompletion.n)} learners recorded as completed in the class logs.`
              : undefined
          }
        />
        <StatCard
          label="Agreement, instructor and measurement (kappa)"
          value={agreement.suppressed ? hidden : agreement.kappa === null ? "–" : formatFixed(agreement.kappa, 2)}
          footnote={
            agreement.suppressed
              ? undefined
              : agreement.pairs
                ? `${kappaWords(agreement.kappa)[0].toUpperCase()}${kappaWords(agreement.kappa).slice(1)}: the two gave the same result for ${formatPercent(agreement.observed)} of ${formatCount(agreement.pairs)} attempts. Kappa is 1 for full agreement and 0 for no better than chance.`
                : "No attempts carry an instructor's result."
          }
        />
      </div>
      <div className="grid grid-cols-2 gap-4 xl:grid-cols-4">
        <StatCard label="Learners trained" value={answer.learners === null ? hidden : formatCount(answer.learners)} footnote="From the class logs" />
        <StatCard label="Classes" value={answer.classes === null ? hidden : formatCount(answer.classes)} />
        <StatCard label="Attempts measured" value={answer.attempts === null ? hidden : formatCount(answer.attempts)} />
        <StatCard
          label="Median score"
          value={answer.medianScore === null ? (answer.suppressed ? hidden : "–") : formatScore(answer.medianScore)}
          footnote="Out of 100"
        />
      </div>
    </div>
  );
}
