/** Public API of the calculation core (SI units throughout). */
export * from "./errors";
export * from "./units";
export * from "./flow";
export * from "./capillary";
export * from "./regression";
export * from "./interpolate";
export * from "./bagley";
export * from "./rabinowitsch";
export * from "./transitionCurve";
export * from "./reduce";
export * from "./forwardFlow";
export * from "./random";
