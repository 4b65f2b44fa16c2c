// The built-in templates ship as files under templates/ so they read (and diff) like any
// workshop template; Vite's `?raw` import inlines them in the SSR build and in vitest alike.
// Built-ins are released together under one version number (BUILTIN_VERSION); every released
// version stays here byte for byte, so a render asked for version n prints what n printed.
import configJson from "../../../templates/config-json.hbt?raw";
import genericHeaderV1 from "../../../templates/generic-header.hbt?raw";
import genericHeaderV2 from "../../../templates/generic-header-v2.hbt?raw";
import readableCopy from "../../../templates/readable-copy.hbt?raw";

export type BuiltinTemplateName = "generic-header" | "readable-copy" | "config-json";

/**
 * The current version of the built-ins. 2: generic-header compiles as C++20 too (decision 015);
 * readable-copy and config-json are unchanged from 1.
 */
export const BUILTIN_VERSION = 2;

/** Each built-in's source at versions 1..BUILTIN_VERSION (index 0 is version 1). */
const RELEASES: Readonly<Record<BuiltinTemplateName, readonly string[]>> = Object.freeze({
  "generic-header": Object.freeze([genericHeaderV1, genericHeaderV2]),
  "readable-copy": Object.freeze([readableCopy, readableCopy]),
  "config-json": Object.freeze([configJson, configJson]),
});

/** The built-ins at the current version. */
export const BUILTIN_TEMPLATES: Readonly<Record<BuiltinTemplateName, string>> = Object.freeze({
  "generic-header": RELEASES["generic-header"][BUILTIN_VERSION - 1],
  "readable-copy": RELEASES["readable-copy"][BUILTIN_VERSION - 1],
  "config-json": RELEASES["config-json"][BUILTIN_VERSION - 1],
});

/** A built-in's source at a released version, or undefined for a version that never was. */
export function builtinSource(name: BuiltinTemplateName, version: number = BUILTIN_VERSION): string | undefined {
  return Number.isInteger(version) && version >= 1 && version <= BUILTIN_VERSION ? RELEASES[name][version - 1] : undefined;
}

/** A partial resolver that knows the built-ins (current version), for templates that build on them. */
export function builtinPartials(name: string): string | undefined {
  return Object.prototype.hasOwnProperty.call(BUILTIN_TEMPLATES, name) ? BUILTIN_TEMPLATES[name as BuiltinTemplateName] : undefined;
}

/** The built-ins' names, in the order pickers list them. */
export const BUILTIN_NAMES = Object.keys(BUILTIN_TEMPLATES) as BuiltinTemplateName[];
export const isBuiltinName = (s: string): s is BuiltinTemplateName => Object.hasOwn(BUILTIN_TEMPLATES, s);

/** What a build renders with until it pins a workshop template; the one built-in a build can pin. */
export const DEFAULT_BUILTIN: BuiltinTemplateName = "generic-header";
