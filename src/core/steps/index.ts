/** Step detection in pressure–time recordings: the public API. SI units throughout. */
export * from "./options";
export * from "./segment";
export * from "./windowFit";
export * from "./robust";
export * from "./transient";
export * from "./plateau";
export * from "./oscillation";
export * from "./positionSpeed";
export * from "./friction";
export * from "./thermalCheck";
export * from "./runSteps";
export * from "./traceSteps";

export * from "./groupSteps";
