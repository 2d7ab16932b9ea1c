// Quarterbeat's scoring core: network policy, stream analysis, attempt score and pass rule.
export * from "./policy";
export * from "./streamErrors";
export * from "./analyzeStream";
export * from "./scoreAttempt";
export * from "./passRuleCriteria";
