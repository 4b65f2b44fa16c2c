// The built-in templates ship as files under templates/ so they read (and diff) like any
// workshop template; Vite's `?raw` import inlines them in the SSR build and in vitest alike.
import configJson from "../../../templates/config-json.hbt?raw";
import genericHeader from "../../../templates/generic-header.hbt?raw";
import readableCopy from "../../../templates/readable-copy.hbt?raw";

export const BUILTIN_TEMPLATES: Readonly<Record<"generic-header" | "readable-copy" | "config-json", string>> = Object.freeze({
  "generic-header": genericHeader,
  "readable-copy": readableCopy,
  "config-json": configJson,
});

export type BuiltinTemplateName = keyof typeof BUILTIN_TEMPLATES;

/** A partial resolver that knows the built-ins, for templates that build on them. */
export function builtinPartials(name: string): string | undefined {
  return Object.prototype.hasOwnProperty.call(BUILTIN_TEMPLATES, name) ? BUILTIN_TEMPLATES[name as BuiltinTemplateName] : undefined;
}

/** The built-ins' names, in the order pickers list them. */
export const BUILTIN_NAMES = Object.keys(BUILTIN_TEMPLATES) as BuiltinTemplateName[];
export const isBuiltinName = (s: string): s is BuiltinTemplateName => Object.hasOwn(BUILTIN_TEMPLATES, s);

/** Built-ins have no saved versions; they render as version 1. */
export const BUILTIN_VERSION = 1;

/** What a build renders with until it pins a workshop template; the one built-in a build can pin. */
export const DEFAULT_BUILTIN: BuiltinTemplateName = "generic-header";
