/** The adapter layer shared by every worksheet function: ranges, option arguments, cell errors. */
export * from "./cellErrors";
export * from "./ranges";
export * from "./args";
export * from "./data";
export * from "./settings";
export * from "./rowCells";
