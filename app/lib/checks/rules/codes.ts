// Every code the validator can emit, with its usual severity and a one-line meaning. Codes are
// stable: editors, scripts and saved review comments match on them, so add codes, never rename.
/** How much a diagnostic matters; defined here, beside the codes, so diagnostics.ts imports this file and not the other way round. */
export type Severity = "error" | "warning" | "info";

export type RuleInfo = { severity: Severity; area: "structure" | "references" | "completeness" | "rig" | "timing" | "power"; summary: string };

export const RULES = {
  // structure (from the schema)
  "wrong-type": { severity: "error", area: "structure", summary: "a value has the wrong type" },
  "missing-field": { severity: "error", area: "structure", summary: "a required field is absent" },
  "not-a-number": { severity: "error", area: "structure", summary: "a number is NaN or infinite" },
  "not-whole-number": { severity: "error", area: "structure", summary: "a count or pin has a fraction" },
  "out-of-range": { severity: "error", area: "structure", summary: "a number is outside what the format allows" },
  "too-few-items": { severity: "error", area: "structure", summary: "a list is shorter than allowed" },
  "too-many-items": { severity: "error", area: "structure", summary: "a list is longer than allowed" },
  "text-too-short": { severity: "error", area: "structure", summary: "a text is empty or too short" },
  "text-too-long": { severity: "error", area: "structure", summary: "a text is too long" },
  "invalid-color": { severity: "error", area: "structure", summary: "a colour is not #rrggbb" },
  "invalid-id": { severity: "error", area: "structure", summary: "an id or look key is not a valid slug" },
  "invalid-format": { severity: "error", area: "structure", summary: "a text does not match its pattern (fallback)" },
  "unknown-format": { severity: "error", area: "structure", summary: "the input is not a hiltbench.config/2 (or /1, upgraded) document" },
  "unknown-choice": { severity: "error", area: "structure", summary: "a value is not one of the allowed choices" },
  "unknown-layer-kind": { severity: "error", area: "structure", summary: "a layer's kind is missing or unknown" },
  "unknown-field": { severity: "error", area: "structure", summary: "a field the format does not know" },
  "invalid-value": { severity: "error", area: "structure", summary: "any other schema complaint (fallback)" },
  "too-many-problems": { severity: "error", area: "structure", summary: "summary of structural problems past the first 50" },
  "semantic-rules-skipped": { severity: "info", area: "structure", summary: "the other checks wait for a well-formed config" },
  // references
  "duplicate-channel-id": { severity: "error", area: "references", summary: "two channels share an id" },
  "duplicate-button-id": { severity: "error", area: "references", summary: "two buttons share an id" },
  "duplicate-font-id": { severity: "error", area: "references", summary: "two fonts share an id" },
  "duplicate-preset-id": { severity: "error", area: "references", summary: "two presets share an id" },
  "duplicate-layer-id": { severity: "error", area: "references", summary: "two layers of one look share an id" },
  "duplicate-preset-name": { severity: "warning", area: "references", summary: "two presets share a name (ignoring case)" },
  "duplicate-font-folder": { severity: "error", area: "references", summary: "two fonts share an SD folder (ignoring case)" },
  "unknown-font": { severity: "error", area: "references", summary: "a preset names a font the build does not have" },
  "unknown-look-channel": { severity: "error", area: "references", summary: "a look is keyed by something that is not a channel" },
  "unknown-mirror-channel": { severity: "error", area: "references", summary: "a mirror names a channel the rig does not have" },
  "mirror-self": { severity: "error", area: "references", summary: "a look mirrors its own channel" },
  "mirror-cycle": { severity: "error", area: "references", summary: "mirrors in one preset form a circle" },
  "unknown-button": { severity: "error", area: "references", summary: "a control names a button the rig does not have" },
  // completeness
  "no-presets": { severity: "error", area: "completeness", summary: "the config has no presets" },
  "missing-look": { severity: "error", area: "completeness", summary: "a preset has no look for a channel" },
  "empty-look": { severity: "warning", area: "completeness", summary: "a look has no enabled layers" },
  "no-ignition-control": { severity: "error", area: "completeness", summary: "nothing can ignite the blade" },
  "no-retraction-control": { severity: "error", area: "completeness", summary: "nothing can retract the blade" },
  "duplicate-trigger": { severity: "error", area: "completeness", summary: "one gesture or motion is bound twice in overlapping states" },
  "font-promised": { severity: "warning", area: "completeness", summary: "a preset's font has not arrived yet" },
  "font-invalid": { severity: "error", area: "completeness", summary: "a preset's font failed its checks" },
  "font-missing-cue": { severity: "warning", area: "completeness", summary: "a font lacks sounds its preset's looks use" },
  "font-missing-control-cue": { severity: "warning", area: "completeness", summary: "a font lacks sounds for events its controls fire" },
  "wipe-off-font-sound": { severity: "warning", area: "timing", summary: "a wipe much shorter or longer than the font's ignite or retract sound" },
  "font-unused": { severity: "info", area: "completeness", summary: "a font no preset uses" },
  "blade-without-ignition-wipe": { severity: "warning", area: "completeness", summary: "a main-blade look has no ignition wipe" },
  "blade-without-retraction-wipe": { severity: "warning", area: "completeness", summary: "a main-blade look has no retraction wipe" },
  "button-unused": { severity: "warning", area: "completeness", summary: "a button has no control bound" },
  "control-without-effect": { severity: "warning", area: "completeness", summary: "a control fires an event no look shows and no font plays" },
  "effect-without-control": { severity: "warning", area: "completeness", summary: "layers answer an event no control fires" },
  // rig
  "unknown-data-pin": { severity: "error", area: "rig", summary: "a channel's pin is not a data pin of the board" },
  "shared-data-pin": { severity: "error", area: "rig", summary: "two channels share a data pin" },
  "unknown-input-pin": { severity: "error", area: "rig", summary: "a button's pin is not an input pin of the board" },
  "shared-input-pin": { severity: "error", area: "rig", summary: "two buttons share a pin" },
  "pin-used-as-data-and-input": { severity: "error", area: "rig", summary: "a button sits on a channel's data pin" },
  "too-many-pixels-on-pin": { severity: "error", area: "rig", summary: "more pixels on one data line than the board drives" },
  "pattern-on-one-pixel": { severity: "warning", area: "rig", summary: "a gradient or drift on a one-pixel channel" },
  "range-beyond-channel": { severity: "warning", area: "rig", summary: "a layer range runs past the channel's pixels" },
  "empty-range": { severity: "error", area: "rig", summary: "a layer range ends at or before its start" },
  "gradient-stops-out-of-order": { severity: "warning", area: "rig", summary: "gradient stops are not listed base to tip" },
  // timing
  "timing-not-positive": { severity: "error", area: "timing", summary: "a duration, period, decay or rate is zero or less" },
  "wipe-duration-out-of-range": { severity: "warning", area: "timing", summary: "a wipe outside 100–5000 ms" },
  "breathe-period-out-of-range": { severity: "warning", area: "timing", summary: "a breathe period outside 500–20000 ms" },
  "spark-decay-out-of-range": { severity: "warning", area: "timing", summary: "a spark decay outside 20–3000 ms" },
  "shimmer-rate-out-of-range": { severity: "warning", area: "timing", summary: "a shimmer rate outside 0.5–60 Hz" },
  // power
  "breathe-floor-above-ceiling": { severity: "error", area: "power", summary: "a breathe's floor is above its ceiling" },
  "peak-over-cell-rating": { severity: "error", area: "power", summary: "a preset's peak exceeds the cell's continuous rating" },
  "peak-near-cell-rating": { severity: "warning", area: "power", summary: "a preset's peak exceeds 80 % of the cell's rating" },
  "wire-drop-high": { severity: "warning", area: "power", summary: "the cell leads lose more than 8 % of the cell's voltage at peak" },
} as const satisfies Record<string, RuleInfo>;

export type RuleCode = keyof typeof RULES;
