// Quarterbeat statistics core: pure functions, no I/O.
export * from "./quantiles";
export * from "./wilson";
export * from "./binomial";
export * from "./funnel";
export * from "./pchart";
export * from "./kappa";
export * from "./pareto";
export * from "./change";
export * from "./difference";
export * from "./agreement";
export * from "./runChart";
export * from "./meanInterval";
export * from "./caseMix";
export * from "./chiSquared";
export * from "./overdispersion";
