// A font layout: file-name patterns that say which cue each file of a font plays. Hiltbench's
// own default reads the cue's word (or one of a few plain synonyms) at the start of the name,
// optionally followed by a variant number, or any file inside a folder named after the cue.
// A workshop can add layouts of its own with the same pattern language.
import { z } from "zod";
import { CUES, cueSchema, type Cue } from "../config/schema";

/**
 * Pattern language, matched case-insensitively against a file's path inside the font:
 *   `*`   any run of characters except `/`
 *   `{n}` an optional variant number: digits, optionally after one `-`, `_`, `.` or space
 * Everything else is literal. Examples: `hum{n}.wav`, `swing/*.wav`, `sfx/lock*.wav`.
 */
export const patternSchema = z
  .string()
  .trim()
  .min(1, "a pattern cannot be empty")
  .max(120)
  .refine((p) => !p.startsWith("/") && !p.split("/").includes(".."), "a pattern is a path inside the font: no leading / and no ..");

export const layoutRuleSchema = z.strictObject({ cue: cueSchema, pattern: patternSchema });
export const fontLayoutSchema = z.strictObject({
  name: z.string().trim().min(1).max(60),
  rules: z.array(layoutRuleSchema).min(1, "a layout needs at least one rule").max(200),
});
export type LayoutRule = z.infer<typeof layoutRuleSchema>;
export type FontLayout = z.infer<typeof fontLayoutSchema>;

/** Words Hiltbench accepts for each cue at the start of a file name (its own choice of synonyms). */
const CUE_WORDS: Record<Cue, string[]> = {
  hum: ["hum", "idle"],
  swing: ["swing"],
  clash: ["clash", "impact"],
  blast: ["blast", "deflect"],
  lockup: ["lockup"],
  drag: ["drag"],
  ignite: ["ignite", "ignition"],
  retract: ["retract", "retraction"],
  boot: ["boot", "startup"],
  name: ["name", "title"],
};

export const DEFAULT_LAYOUT: FontLayout = {
  name: "Hiltbench default",
  rules: CUES.flatMap((cue) => [
    ...CUE_WORDS[cue].map((w) => ({ cue, pattern: `${w}{n}.wav` })),
    ...CUE_WORDS[cue].map((w) => ({ cue, pattern: `${w}/*.wav` })),
  ]),
};

export type CompiledLayout = { name: string; match(path: string): Cue | null };

function patternRegex(pattern: string): RegExp {
  let src = "";
  for (let i = 0; i < pattern.length; i++) {
    if (pattern.startsWith("{n}", i)) {
      src += "(?:[-_. ]?\\d{1,4})?";
      i += 2;
    } else if (pattern[i] === "*") src += "[^/]*";
    else src += pattern[i].replace(/[.+?^${}()|[\]\\]/g, "\\$&");
  }
  return new RegExp(`^${src}$`, "i");
}

/** The first rule that matches wins, so a workshop orders its rules from specific to general. */
export function compileLayout(layout: FontLayout): CompiledLayout {
  const rules = layout.rules.map((r) => ({ cue: r.cue, re: patternRegex(r.pattern) }));
  return {
    name: layout.name,
    match(path) {
      for (const r of rules) if (r.re.test(path)) return r.cue;
      return null;
    },
  };
}

/** Parse a layout typed as lines of `cue: pattern` (the workshop form). */
export function parseLayoutText(name: string, text: string) {
  const rules: { cue: string; pattern: string }[] = [];
  const errors: string[] = [];
  text.split(/\r?\n/).forEach((line, i) => {
    const t = line.trim();
    if (!t || t.startsWith("#")) return;
    const m = /^([a-z]+)\s*:\s*(.+)$/i.exec(t);
    if (!m) return void errors.push(`Line ${i + 1}: write "cue: pattern", e.g. "hum: sfx/hum{n}.wav".`);
    rules.push({ cue: m[1].toLowerCase(), pattern: m[2].trim() });
  });
  const parsed = fontLayoutSchema.safeParse({ name, rules });
  if (!parsed.success) for (const issue of parsed.error.issues) errors.push(issueText(issue, rules));
  return errors.length ? { ok: false as const, errors } : { ok: true as const, layout: parsed.data! };
}

function issueText(issue: z.core.$ZodIssue, rules: { cue: string }[]): string {
  const [first, index, field] = issue.path;
  if (first === "rules" && typeof index === "number") {
    if (field === "cue") return `Rule ${index + 1}: "${rules[index]?.cue}" is not a cue; use one of ${CUES.join(", ")}.`;
    return `Rule ${index + 1}: ${issue.message}.`;
  }
  return `${String(first ?? "layout")}: ${issue.message}.`;
}
