// Power and wiring math: pure functions, no I/O.
export * from "./wire";
export * from "./current";
export * from "./estimate";
export { boundPixels, lookBound, spotRange, type Bound, type Mode } from "./bounds";
