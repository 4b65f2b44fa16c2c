// The model diff and the three-way merge, one pure module: the compare page, the look editor's
// conflict view and (later) the preset library use it.
export { applyDelta, diffModels, modelDelta, type Change, type ChangeKind, type ModelDiff } from "./diff";
export { merge3, type Conflict, type MergeResult, type Side } from "./merge";
export { stableJson } from "./keys";
