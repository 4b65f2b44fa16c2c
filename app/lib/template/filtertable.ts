// The one table of filters a template can name. A Map, so '__proto__' or 'constructor' is
// simply an unknown filter.
import { C_FILTERS } from "./cfilters";
import { GENERAL_FILTERS, type FilterDef } from "./filters";

export const FILTERS: ReadonlyMap<string, FilterDef> = new Map([...GENERAL_FILTERS, ...C_FILTERS]);
