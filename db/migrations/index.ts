// The list of migrations, in order. A static list (rather than reading the folder) works the
// same under tsx, Vitest and the Vite server build.
import type { Migration } from "kysely";
import * as m0001 from "./20261202_0001_foundation";
import * as m0300 from "./20261202_0300_templates";
import * as m0400 from "./20261202_0400_template_delete";
import * as m0500 from "./20261202_0500_config_saved_at";
import * as m0600 from "./20261202_0600_template_version_uses";
import * as m0700 from "./20261202_0700_revisions";
import * as m0750 from "./20261202_0750_mail";
import * as m0760 from "./20261202_0760_reviews";
import * as m0800 from "./20261202_0800_fonts";
import * as m1100 from "./20261202_1100_rate_limits";
import * as m20261203_0100 from "./20261203_0100_font_upload_revision";
import * as m0100b from "./20261203_0100_preset_library";
import * as m1300 from "./20261203_1300_release";
import * as m1310 from "./20261203_1310_preset_origin_history";
import * as m1320 from "./20261203_1320_client_requests";
import * as m1400 from "./20261203_1400_sign_in_codes";

export const migrations: Record<string, Migration> = {
  "20261202_0001_foundation": m0001,
  "20261202_0300_templates": m0300,
  "20261202_0400_template_delete": m0400,
  "20261202_0500_config_saved_at": m0500,
  "20261202_0600_template_version_uses": m0600,
  "20261202_0700_revisions": m0700,
  "20261202_0750_mail": m0750,
  "20261202_0760_reviews": m0760,
  "20261202_0800_fonts": m0800,
  "20261202_1100_rate_limits": m1100,
  "20261203_0100_font_upload_revision": m20261203_0100,
  "20261203_0100_preset_library": m0100b,
  "20261203_1300_release": m1300,
  "20261203_1310_preset_origin_history": m1310,
  "20261203_1320_client_requests": m1320,
  "20261203_1400_sign_in_codes": m1400,
};
