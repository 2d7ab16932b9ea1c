// The filters of the learner pages, for the page and for the route's loader that starts the same requests at
// navigation (src/features/insight/prefetch.ts).
import { filteredPagePrefetch } from "../insight/prefetch";
import type { OptionalFilter } from "../insight/useInsightFilters";
import { learnerQueries } from "./queries";

export const retentionFilters: readonly OptionalFilter[] = ["patientType"];
export const calibrationFilters: readonly OptionalFilter[] = [];

export const prefetchRetention = filteredPagePrefetch(retentionFilters, { ranges: true }, (filters) => learnerQueries.retention(filters));
export const prefetchCalibration = filteredPagePrefetch(calibrationFilters, { ranges: true }, (filters) => learnerQueries.calibration(filters));
