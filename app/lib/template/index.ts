// Hiltbench's template language: compile a template once and render a config through it.
// Everything here is pure: no React, no database, no clock.
export { compileTemplate, renderTemplate, render } from "./compile";
export type { CompiledTemplate, CompileOptions, CompileResult, RenderMeta, RenderResult } from "./compile";
export { formatError, TemplateFailure } from "./errors";
export type { TemplateError, Stage, Severity } from "./errors";
export { BUILTIN_NAMES, BUILTIN_TEMPLATES, BUILTIN_VERSION, DEFAULT_BUILTIN, builtinPartials, builtinSource, isBuiltinName } from "./builtins";
export type { BuiltinTemplateName } from "./builtins";
export { templateCache, parseTemplate } from "./cache";
export { DEFAULT_LIMITS } from "./limits";
export type { Limits } from "./limits";
export { FILTERS } from "./filtertable";
export { toCIdentifier, toCString, toCComment, C11_KEYWORDS } from "./cfilters";
