// The preset library's pure rules: the body format, scaling, adding to a build, updates and the dry run.
export * from "./format";
export * from "./scale";
export * from "./adapt";
export * from "./update";
export * from "./standin";
export * from "./check";
export * from "./dry-run";
