// Reading a generic header (the built-in C-header form) back into the model, so a hand-edited
// file can be validated. Shares nothing with the template language: it reads C, not templates.
export { readHeader } from "./readback";
export type { ReadError } from "./readback";
export { readAndCheck, summarize } from "./check";
export type { HeaderCheck } from "./check";
