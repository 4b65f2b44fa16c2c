// Hiltbench's template language: compile a template once, render a config through it, read a
// generic header back into the model. Everything here is pure: no React, no database, no clock.
export { compileTemplate, renderTemplate, render } from "./compile";
export type { CompiledTemplate, CompileOptions, CompileResult, RenderMeta, RenderResult } from "./compile";
export { formatError, TemplateFailure } from "./errors";
export type { TemplateError, Stage, Severity } from "./errors";
export { BUILTIN_TEMPLATES, builtinPartials } from "./builtins";
export type { BuiltinTemplateName } from "./builtins";
export { readHeader } from "./readback";
export type { ReadError } from "./readback";
export { templateCache, parseTemplate } from "./cache";
export { DEFAULT_LIMITS } from "./limits";
export type { Limits } from "./limits";
export { FILTERS } from "./filtertable";
export { toCIdentifier, toCString, toCComment, C11_KEYWORDS } from "./cfilters";
