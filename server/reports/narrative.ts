// A few plain sentences written from the report's figures. They use only figures that are already shown
// (hidden ones stay hidden in words too), never name a person, site or device, and do not read a trend into
// changes that the intervals cannot tell apart.
import type { CountFigure, ReportData } from "../../shared/schemas/report";
import { formatPercent, formatPoints } from "./figures";

/**
 * Words for Cohen's kappa after Landis and Koch, Biometrics 1977;33:159–174 (bands from memory). The
 * narrative passes the kappa as printed (two decimals), so "0.40" never reads as "moderate".
 */
export function kappaWords(kappa: number): string {
  if (kappa < 0) return "poorer than chance";
  if (kappa <= 0.2) return "slight";
  if (kappa <= 0.4) return "fair";
  if (kappa <= 0.6) return "moderate";
  if (kappa <= 0.8) return "substantial";
  return "almost perfect";
}

/** "12 classes", "fewer than 5 classes", "1 class"; a count hidden to protect another reads "a number of … not shown here". */
function plural(figure: CountFigure, one: string, many: string): string {
  if (figure.hidden === "protects-other") return `a number of ${many} not shown here`;
  return `${figure.text} ${figure.value === 1 ? one : many}`;
}

export function writeNarrative(data: ReportData): string[] {
  if (!data.hasData) return [`No classes or measured attempts were recorded for ${data.periodLabel}.`];
  const sentences: string[] = [];
  const { reach } = data;

  sentences.push(
    `In ${data.periodLabel}, ${plural(reach.instructors, "instructor", "instructors")} at ${plural(reach.sites, "site", "sites")} ` +
      `ran ${plural(reach.classes, "class", "classes")} for ${plural(reach.learners, "learner", "learners")}, ` +
      `and ${plural(reach.attempts, "attempt was", "attempts were")} measured on training manikins.`,
  );

  const rate = data.passRate;
  if (rate.value !== null) {
    sentences.push(`${formatPercent(rate.value)} of measured attempts met the network's pass rule (95 % interval ${rate.intervalText}).`);
    for (const comparison of data.comparisons) {
      const earlier = comparison.passRate;
      if (comparison.verdict === null || earlier.value === null || comparison.changePoints === null) continue;
      if (comparison.verdict === "no clear change") {
        sentences.push(`That is no clear change from ${comparison.label} (${earlier.text}): the 95 % interval of the difference includes no change.`);
      } else {
        const direction = comparison.verdict === "up" ? "rose" : "fell";
        sentences.push(
          `Compared with ${comparison.label}, the pass rate ${direction} from ${earlier.text} to ${rate.text} ` + `(${formatPoints(comparison.changePoints)}).`,
        );
      }
    }
  } else {
    sentences.push(`Too few attempts were measured to show a pass rate for the period.`);
  }

  const top = data.errors.rows[0];
  if (top && top.count.value !== null && reach.attempts.value) {
    const shareOfAttempts = top.count.value / reach.attempts.value;
    const second = data.errors.rows[1];
    const also = second && second.count.value !== null ? `, followed by "${second.label.toLowerCase()}"` : "";
    sentences.push(`The most common problem was "${top.label.toLowerCase()}", seen in ${formatPercent(shareOfAttempts)} of attempts${also}.`);
  }

  const { live, hidden, verdict } = data.feedback;
  if (live.passRate.value !== null && hidden.passRate.value !== null && verdict) {
    const comparison = verdict === "no clear change" ? "not clearly different from" : verdict === "up" ? "higher than" : "lower than";
    sentences.push(`With the live display shown, ${live.passRate.text} of attempts passed: ${comparison} the ${hidden.passRate.text} with the display hidden.`);
  }

  const agreement = data.agreement;
  if (agreement.kappa !== null && agreement.observedAgreement !== null) {
    sentences.push(
      `Where instructors also recorded a pass or fail, they agreed with the measurement in ${formatPercent(agreement.observedAgreement)} ` +
        `of attempts (Cohen's kappa ${agreement.kappaText}, ${kappaWords(Number(agreement.kappaText))} agreement beyond chance).`,
    );
  }
  if (agreement.completionRate.value !== null && agreement.everPassedRate.value !== null) {
    sentences.push(
      `Instructors recorded ${agreement.completionRate.text} of learners as completing the course; ` +
        `on the manikin, ${agreement.everPassedRate.text} of the learners measured passed at least once.`,
    );
  }
  return sentences;
}
