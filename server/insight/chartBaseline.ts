// Which quarters set the overview p-chart's centre line: a coordinator's setting, or the first four quarters
// with attempts. Kept in the key/value settings, so no quarter being judged can move its own centre line.
import { DEFAULT_BASELINE_QUARTERS, chartBaselineSettingSchema, type ChartBaseline, type ChartBaselineSetting } from "../../shared/schemas/chartSettings";
import type { Db } from "../db/client";
import { getSetting, setSetting } from "../settings/store";
import { quartersWithData } from "./quarters";

const SETTING_KEY = "chart_baseline";

export function chartBaseline(db: Db): ChartBaseline {
  const stored = getSetting(db, SETTING_KEY);
  if (stored) {
    const parsed = chartBaselineSettingSchema.safeParse(JSON.parse(stored));
    if (parsed.success) return { ...parsed.data, source: "setting" };
  }
  const oldestFirst = [...quartersWithData(db)].reverse();
  if (oldestFirst.length === 0) return { from: null, to: null, source: "default" };
  return { from: oldestFirst[0], to: oldestFirst[Math.min(DEFAULT_BASELINE_QUARTERS, oldestFirst.length) - 1], source: "default" };
}

/** Saves the baseline (null: back to the default); the write itself moves the data state on (db/dataState.ts). */
export function saveChartBaseline(db: Db, baseline: ChartBaselineSetting | null): ChartBaseline {
  setSetting(db, SETTING_KEY, baseline === null ? "null" : JSON.stringify(baseline));
  return chartBaseline(db);
}
