// Row types for every table, in one interface that Kysely checks queries against.
import type { ColumnType, Generated, Insertable, Selectable, Updateable } from "kysely";
import type { Config } from "~/lib/config/schema";

type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;

export const ROLES = ["owner", "builder", "reviewer", "client"] as const;
export type Role = (typeof ROLES)[number];
export const BUILD_STATUSES = ["intake", "configuring", "in-review", "approved", "released"] as const;
export type BuildStatus = (typeof BUILD_STATUSES)[number];

export interface WorkshopsTable {
  id: Generated<string>;
  name: string;
  slug: string;
  created_at: Timestamp;
}

export interface UsersTable {
  id: Generated<string>;
  github_login: string | null;
  email: string | null;
  display_name: string;
  created_at: Timestamp;
}

export interface MembershipsTable {
  workshop_id: string;
  user_id: string;
  role: Role;
  created_at: Timestamp;
}

export interface InvitationsTable {
  id: Generated<string>;
  workshop_id: string;
  github_login: string | null;
  email: string | null;
  role: Role;
  invited_by: string | null;
  created_at: Timestamp;
  accepted_at: Date | null;
}

export interface BuildsTable {
  id: Generated<string>;
  workshop_id: string;
  name: string;
  client_name: Generated<string>;
  client_user_id: string | null;
  hilt_notes: Generated<string>;
  status: BuildStatus;
  config: ColumnType<Config, string, string>;
  config_version: Generated<number>;
  archived_at: Date | null;
  created_at: Timestamp;
  updated_at: Timestamp;
  /** When the config was last saved (config_version changed); renders print this, not updated_at. */
  config_saved_at: Timestamp;
  /** The workshop template version the build renders with; null = the built-in generic header. */
  pinned_template_id: Generated<string | null>;
  pinned_template_version: Generated<number | null>;
}

export interface TemplatesTable {
  id: Generated<string>;
  workshop_id: string;
  name: string;
  created_by: string | null;
  created_at: Timestamp;
}

/** name → the template and version a saved version resolves `use "name"` to (transitively). */
export type TemplateUses = Record<string, { id: string; version: number }>;

/** Immutable: a new save is a new row. */
export interface TemplateVersionsTable {
  template_id: string;
  version: number;
  source: string;
  created_by: string | null;
  created_at: Timestamp;
  /** Null until recorded; set once (migration 0600). */
  uses: ColumnType<TemplateUses | null, string | null | undefined, string | null>;
}

/**
 * One saved config of a build (migration 0700). Immutable: a trigger refuses UPDATE and DELETE
 * (apart from the database's own cascades: the build deleted, the author's account deleted).
 */
export interface ConfigRevisionsTable {
  id: Generated<string>;
  build_id: string;
  /** Copied from the build, for scoping reads; no foreign key (see the migration). */
  workshop_id: string;
  /** The build's `config_version` after this save; unique per build. */
  number: number;
  config: ColumnType<Config, string, never>;
  /** Who saved it; null for backfilled rows and deleted accounts. */
  author_id: string | null;
  /** Equal to the build's `config_saved_at` for this save: renders of the revision print it. */
  created_at: Timestamp;
  message: string | null;
  /** The build's template pin at that moment (no foreign key: a record, not a reference). */
  template_id: string | null;
  template_version: number | null;
  error_count: Generated<number>;
  warning_count: Generated<number>;
}

export interface SessionsTable {
  id: string;
  data: ColumnType<Record<string, unknown>, string, string>;
  expires_at: Date;
}

export interface ApiTokensTable {
  id: Generated<string>;
  user_id: string;
  name: string;
  token_hash: string;
  prefix: string;
  created_at: Timestamp;
  last_used_at: Date | null;
  revoked_at: Date | null;
}

export interface StoredFilesTable {
  sha256: string;
  size: number;
  storage: "disk" | "s3";
  key: string;
  created_at: Timestamp;
}

export interface FontUploadsTable {
  id: Generated<string>;
  build_id: string;
  font_id: string;
  layout_name: string;
  status: "received" | "invalid";
  /** The font report (app/lib/fonts/report.ts) as it was when the files were accepted. */
  report: ColumnType<unknown, string, string>;
  uploaded_by: string | null;
  /** The revision this upload's save made (null only while the upload's transaction runs). */
  revision: ColumnType<number | null, number | null | undefined, number | null>;
  created_at: Timestamp;
}

export interface FontFilesTable {
  upload_id: string;
  path: string;
  sha256: string;
  size: number;
  cue: string | null;
  duration_ms: number;
}

export interface FontLayoutsTable {
  id: Generated<string>;
  workshop_id: string;
  name: string;
  rules: ColumnType<{ cue: string; pattern: string }[], string, string>;
  created_at: Timestamp;
}

/** One e-mail on its way: written with what caused it, delivered by the `mail.send` queue. */
export interface MailOutboxTable {
  id: Generated<string>;
  kind: string;
  to_address: string;
  subject: string;
  text_body: string;
  html_body: string;
  created_at: Timestamp;
  attempts: Generated<number>;
  last_attempt_at: Date | null;
  last_error: string | null;
  sent_at: Date | null;
  smtp_response: string | null;
}

/** What the local SMTP sink received (development and tests only). */
export interface MailSinkMessagesTable {
  id: Generated<string>;
  received_at: Timestamp;
  message_id: string | null;
  envelope_from: string;
  envelope_to: string[];
  header_from: Generated<string>;
  header_to: Generated<string>;
  subject: Generated<string>;
  text_body: string | null;
  html_body: string | null;
  raw: string;
}

export const REVIEW_STATES = ["open", "approved", "changes-requested"] as const;
export type ReviewState = (typeof REVIEW_STATES)[number];
export type Verdict = "approved" | "changes-requested";

/** A builder's request that reviewers read one revision; keeps the text they read. */
export interface ReviewRequestsTable {
  id: Generated<string>;
  build_id: string;
  workshop_id: string;
  revision: number;
  requested_by: string | null;
  note: Generated<string>;
  template_label: string;
  rendered: string;
  state: Generated<ReviewState>;
  decided_at: Date | null;
  created_at: Timestamp;
}

export interface ReviewReviewersTable {
  request_id: string;
  reviewer_id: string;
  verdict: Verdict | null;
  verdict_note: string | null;
  verdict_at: Date | null;
}

/** A thread's first comment has a line (and that line's text) or a model path; replies have neither. */
export interface ReviewCommentsTable {
  id: Generated<string>;
  request_id: string;
  thread_id: string | null;
  author_id: string | null;
  body: string;
  line: number | null;
  line_text: string | null;
  model_path: string | null;
  resolved_at: Date | null;
  resolved_by: string | null;
  created_at: Timestamp;
}

/** A workshop's library preset (migration 20261203_0100); name, tags and notes follow the latest publish. */
export interface LibraryPresetsTable {
  id: Generated<string>;
  workshop_id: string;
  name: string;
  tags: Generated<string[]>;
  notes: Generated<string>;
  /** The number of the last publish (versions are never renumbered, even after a delete). */
  head_version: Generated<number>;
  created_by: string | null;
  created_at: Timestamp;
  published_at: Timestamp;
}

/** One immutable publish of a library preset: a trigger refuses UPDATE and DELETE (see the migration). */
export interface LibraryVersionsTable {
  preset_id: string;
  version: number;
  workshop_id: string;
  /** The preset's body (library/format.ts), stored as JSON. */
  body: ColumnType<unknown, string, never>;
  changelog: string;
  author_id: string | null;
  created_at: Timestamp;
  error_count: Generated<number>;
  warning_count: Generated<number>;
}

/** Where a build's preset came from: which library preset, which version. */
export interface BuildPresetOriginsTable {
  build_id: string;
  /** The preset's id in the build's config. */
  preset_id: string;
  workshop_id: string;
  library_preset_id: string;
  library_version: number;
  added_at: Timestamp;
}

/** A preset's library origin set (or cleared: both null) from a revision on; see build_preset_origins for today's. */
export interface PresetOriginEventsTable {
  id: Generated<string>;
  build_id: string;
  preset_id: string;
  revision: number;
  library_preset_id: string | null;
  library_version: number | null;
  recorded_at: Generated<Date>;
}

export type ClientRequestKind = "font" | "colour" | "fault" | "other";
export type ClientRequestStatus = "open" | "in-hand" | "done" | "declined";

/** What a client asks for after handoff, with the workshop's status and reply (app/lib/requests/). */
export interface ClientRequestsTable {
  id: Generated<string>;
  build_id: string;
  workshop_id: string;
  kind: ClientRequestKind;
  message: string;
  status: Generated<ClientRequestStatus>;
  reply: Generated<string>;
  asked_by: string | null;
  asked_at: Generated<Date>;
  handled_by: string | null;
  updated_at: Generated<Date>;
  version: Generated<number>;
}

/** One ticked item of a revision's bench check (the list itself is generated, app/lib/release/). */
export interface BenchCheckTicksTable {
  build_id: string;
  revision: number;
  item_key: string;
  ticked_by: string | null;
  ticked_at: Generated<Date>;
}

/** One immutable release of a build: the revision handed over and its bundle's checksum. */
export interface ReleasesTable {
  id: Generated<string>;
  build_id: string;
  workshop_id: string;
  number: number;
  revision: number;
  /** The bundle's template, as BundleResult's `template.ref`. */
  template_ref: string;
  /** The template's version the bundle rendered with: the same bytes come back after later edits. */
  template_version: number;
  name_mode: "long" | "8.3";
  /** numeric: pg answers a string. */
  card_gb: ColumnType<string, number | string, never>;
  bundle_sha256: string;
  /** bigint: pg answers a string. */
  bundle_bytes: ColumnType<string, number | string, never>;
  note: Generated<string>;
  released_by: string | null;
  released_at: Generated<Date>;
}

/** One e-mailed sign-in code: the address it went to, wrong tries, and its one use (decision 023). */
export interface SignInCodesTable {
  id: Generated<string>;
  email: string;
  /** SHA-256 of the encrypted code held in the browser's cookie. */
  token_hash: string;
  /** SHA-256 of the one-time link's token. */
  link_hash: string;
  attempts: Generated<number>;
  created_at: Generated<Date>;
  expires_at: Date;
  used_at: Date | null;
}

export interface Database {
  workshops: WorkshopsTable;
  users: UsersTable;
  memberships: MembershipsTable;
  invitations: InvitationsTable;
  builds: BuildsTable;
  sessions: SessionsTable;
  api_tokens: ApiTokensTable;
  templates: TemplatesTable;
  template_versions: TemplateVersionsTable;
  config_revisions: ConfigRevisionsTable;
  stored_files: StoredFilesTable;
  font_uploads: FontUploadsTable;
  font_files: FontFilesTable;
  font_layouts: FontLayoutsTable;
  mail_outbox: MailOutboxTable;
  mail_sink_messages: MailSinkMessagesTable;
  review_requests: ReviewRequestsTable;
  review_reviewers: ReviewReviewersTable;
  review_comments: ReviewCommentsTable;
  library_presets: LibraryPresetsTable;
  library_versions: LibraryVersionsTable;
  build_preset_origins: BuildPresetOriginsTable;
  preset_origin_events: PresetOriginEventsTable;
  bench_check_ticks: BenchCheckTicksTable;
  client_requests: ClientRequestsTable;
  releases: ReleasesTable;
  sign_in_codes: SignInCodesTable;
}

export type UserRow = Selectable<UsersTable>;
export type BuildRow = Selectable<BuildsTable>;
export type NewBuild = Insertable<BuildsTable>;
export type BuildUpdate = Updateable<BuildsTable>;
export type WorkshopRow = Selectable<WorkshopsTable>;
export type InvitationRow = Selectable<InvitationsTable>;
export type ConfigRevisionRow = Selectable<ConfigRevisionsTable>;
export type NewConfigRevision = Insertable<ConfigRevisionsTable>;
