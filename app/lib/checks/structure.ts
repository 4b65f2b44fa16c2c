// Turns the schema's complaints into sentences an installer can act on, each with the JSON path
// of the value. zod's own wording ("Too small: expected number to be >=1") stays out of sight.
import type { z } from "zod";
import { formatPath, type Diagnostic, type PathSegment } from "./diagnostics";
import type { RuleCode } from "./rules/codes";

/** Past this many structural problems, one summary stands in for the rest. */
export const MAX_STRUCTURE_DIAGNOSTICS = 50;

function valueAt(input: unknown, path: readonly PropertyKey[]): unknown {
  let v: unknown = input;
  for (const seg of path) {
    if (v === null || typeof v !== "object") return undefined;
    v = (v as Record<PropertyKey, unknown>)[seg];
  }
  return v;
}

function show(v: unknown): string {
  if (typeof v === "string") return JSON.stringify(v.length > 40 ? `${v.slice(0, 40)}…` : v);
  if (typeof v === "number") return Number.isNaN(v) ? "NaN" : String(v);
  if (Array.isArray(v)) return `a list of ${v.length}`;
  if (v === null) return "null";
  if (typeof v === "object") return "an object";
  return String(v);
}

function kindOf(v: unknown): string {
  if (v === null) return "null";
  if (Array.isArray(v)) return "a list";
  if (typeof v === "number" && !Number.isFinite(v)) return Number.isNaN(v) ? "NaN" : "infinite";
  if (typeof v === "object") return "an object";
  return `a ${typeof v}`;
}

const EXPECTED: Record<string, string> = {
  object: "an object",
  array: "a list",
  string: "text",
  number: "a number",
  int: "a whole number",
  boolean: "true or false",
};

function listChoices(values: readonly unknown[]): string {
  const words = values.map((v) => JSON.stringify(v));
  return words.length <= 1 ? words.join("") : `${words.slice(0, -1).join(", ")} or ${words[words.length - 1]}`;
}

function one(issue: z.core.$ZodIssue, input: unknown, path: string): Diagnostic {
  const value = valueAt(input, issue.path);
  const where = path === "" ? "The config" : path;
  const d = (code: RuleCode, message: string, hint: string): Diagnostic => ({ severity: "error", code, path, message, hint });
  switch (issue.code) {
    case "invalid_type": {
      const expected = EXPECTED[issue.expected] ?? issue.expected;
      if (value === undefined && issue.path.at(-1) === "id" && issue.path.at(-3) === "layers")
        return d("missing-field", `${where} is missing: in a hiltbench.config/2 document every layer has an id.`, 'Give the layer an id of its own in this look (e.g. "l-3k9x2a"), or send the document as "hiltbench.config/1", whose layers get ids when read.');
      if (value === undefined) return d("missing-field", `${where} is missing.`, `Add it: it should be ${expected}.`);
      if (typeof value === "number" && !Number.isFinite(value))
        return d("not-a-number", `${where} is ${show(value)}, which is not a usable number.`, "Check the calculation that produced it; JSON cannot carry NaN or Infinity either.");
      if (issue.expected === "int" && typeof value === "number")
        return d("not-whole-number", `${where} is ${value}, but it must be a whole number.`, `Round it, e.g. to ${Math.round(value)}.`);
      if (path === "") return d("wrong-type", `The config should be an object, but it is ${kindOf(value)}.`, "Send one JSON object with format, rig, fonts, presets and controls.");
      return d("wrong-type", `${where} should be ${expected}, but it is ${kindOf(value)}${typeof value === "string" || typeof value === "number" ? ` (${show(value)})` : ""}.`, `Write it as ${expected}.`);
    }
    case "too_small":
    case "too_big": {
      const small = issue.code === "too_small";
      const limit = Number(small ? issue.minimum : issue.maximum);
      const strict = !issue.inclusive;
      const bound = `${small ? "at least" : "at most"} ${strict ? (small ? limit + 1 : limit - 1) : limit}`;
      if (issue.origin === "array" || issue.origin === "set") {
        const n = Array.isArray(value) ? value.length : 0;
        return d(small ? "too-few-items" : "too-many-items", `${where} has ${n} item${n === 1 ? "" : "s"}; it needs ${bound}.`, small ? "Add the missing entries." : "Remove entries, or split them over more presets or looks.");
      }
      if (issue.origin === "string") {
        const n = typeof value === "string" ? value.length : 0;
        return d(small ? "text-too-short" : "text-too-long", `${where} has ${n} character${n === 1 ? "" : "s"}; it needs ${bound}.`, small ? "Fill it in." : "Shorten it.");
      }
      const range = strict ? `${small ? "above" : "below"} ${limit}` : bound;
      return d("out-of-range", `${where} is ${show(value)}, but it must be ${range}.`, `Choose a value ${range}.`);
    }
    case "invalid_format": {
      const isColour = issue.pattern?.includes("#") ?? false;
      return d(isColour ? "invalid-color" : issue.pattern?.includes("a-z0-9") ? "invalid-id" : "invalid-format", `${where} is ${show(value)}, which is not valid: ${issue.message}.`, isColour ? "Use # and six hex digits (0–9, a–f)." : "Rewrite it in the form described.");
    }
    case "invalid_value": {
      if (issue.path.length === 1 && issue.path[0] === "format")
        return d("unknown-format", `This is not a Hiltbench config (format is ${show(value)}).`, `Set format to ${listChoices(issue.values)} (a "hiltbench.config/1" document is also read, and upgraded).`);
      if (value === undefined) return d("missing-field", `${where} is missing.`, `Add it: choose ${listChoices(issue.values)}.`);
      return d("unknown-choice", `${where} is ${show(value)}, which is not one of the choices.`, `Choose ${listChoices(issue.values)}.`);
    }
    case "invalid_union": {
      const disc = (issue as { discriminator?: string }).discriminator;
      const options = (issue as { options?: unknown[] }).options ?? [];
      if (disc === "kind")
        return d("unknown-layer-kind", value === undefined ? `${where} is missing, so the layer's kind is unknown.` : `${where} is ${show(value)}, which is not a layer kind.`, `Use one of ${listChoices(options)}.`);
      return d("unknown-choice", `${where} is ${show(value)}, which is not one of the choices.`, options.length ? `Choose ${listChoices(options)}.` : "Check the spelling.");
    }
    case "unrecognized_keys":
      return d("unknown-field", `${where} has a field this config format does not know: ${issue.keys.join(", ")}.`, "Remove it or check its spelling; field names are case-sensitive.");
    case "invalid_key": {
      const key = issue.path[issue.path.length - 1];
      return d("invalid-id", `The key ${JSON.stringify(String(key))} is not a valid id.`, "Ids use 1–48 lowercase letters, digits or dashes, starting with a letter or digit.");
    }
    default:
      return d("invalid-value", `${where} is not valid (${issue.message}).`, "Check this value against the config format.");
  }
}

/** Readable diagnostics for a failed parse, capped at MAX_STRUCTURE_DIAGNOSTICS plus a summary. */
export function structureDiagnostics(issues: readonly z.core.$ZodIssue[], input: unknown): Diagnostic[] {
  const out: Diagnostic[] = [];
  for (const issue of issues) {
    if (out.length === MAX_STRUCTURE_DIAGNOSTICS) break;
    const segments = issue.path.filter((s): s is PathSegment => typeof s !== "symbol");
    // An unknown key names a field that has no value to point at: point at the field itself.
    const path = issue.code === "unrecognized_keys" && issue.keys.length === 1 ? formatPath([...segments, issue.keys[0]]) : formatPath(segments);
    out.push(one(issue, input, path));
  }
  if (issues.length > MAX_STRUCTURE_DIAGNOSTICS) {
    const more = issues.length - MAX_STRUCTURE_DIAGNOSTICS;
    out.push({
      severity: "error",
      code: "too-many-problems",
      path: "",
      message: `${more} more structural problem${more === 1 ? "" : "s"} not listed.`,
      hint: "Fix the ones above and validate again; many often share one cause.",
    });
  }
  return out;
}
