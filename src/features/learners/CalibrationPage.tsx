// Calibration: how an instructor's pass/fail agrees with the manikin's measurement. An instructor sees their
// own, privately; the coordinator and the quality lead see every instructor.
import { useQuery } from "@tanstack/react-query";
import { PageHeader } from "../../components/PageHeader";
import { useCan } from "../auth/useCan";
import { InsightFilters } from "../insight/InsightFilters";
import { QueryStatus } from "../insight/QueryStatus";
import type { InsightFilterState } from "../insight/useInsightFilters";
import { AllCalibration, OwnCalibration } from "./CalibrationViews";
import { learnerQueries } from "./queries";
import { calibrationFilters } from "./pageRequests";

export default function CalibrationPage() {
  const seesAll = useCan("readCalibration", "any");
  return (
    <div>
      <PageHeader
        title="Judgement calibration"
        description={
          seesAll
            ? "How each instructor's pass/fail agrees with the manikin's measurement: who passes measured failures, who fails measured passes."
            : "How your own pass/fail agrees with the manikin's measurement. Other instructors are not named."
        }
      />
      <InsightFilters optional={calibrationFilters} ranges label="Choose the period">
        {(state) => <Calibration state={state} seesAll={seesAll} />}
      </InsightFilters>
    </div>
  );
}

function Calibration({ state, seesAll }: { state: InsightFilterState; seesAll: boolean }) {
  const query = useQuery(learnerQueries.calibration(state.api));
  return (
    <div className="flex flex-col gap-4">
      <p className="text-small text-muted">
        Only attempts the instructor marked pass or fail count. The measurement is Quarterbeat's score under the network's pass rule; kappa's words follow
        Landis and Koch (1977).
      </p>
      <QueryStatus query={query} loadingLabel="Loading calibration…" errorTitle="Calibration could not be loaded">
        {(answer) => (seesAll ? <AllCalibration answer={answer} /> : <OwnCalibration answer={answer} />)}
      </QueryStatus>
    </div>
  );
}
