// Where files go and how big uploads may be, from the environment, checked with zod the first
// time storage is used. Disk under the data folder is the default; S3 when HB_STORAGE=s3.
import path from "node:path";
import { z } from "zod";
import { DiskStorage } from "./disk.server";
import { S3Storage } from "./s3.server";
import type { FileStorage } from "./types";

const MB = 1024 * 1024;
const schema = z
  .object({
    HB_DATA_DIR: z.string().min(1).default(".data"),
    HB_STORAGE: z.enum(["disk", "s3"]).default("disk"),
    HB_S3_ENDPOINT: z.string().url().optional(),
    HB_S3_REGION: z.string().min(1).default("us-east-1"),
    HB_S3_BUCKET: z.string().min(3).optional(),
    HB_S3_ACCESS_KEY_ID: z.string().min(1).optional(),
    HB_S3_SECRET_ACCESS_KEY: z.string().min(1).optional(),
    HB_S3_PATH_STYLE: z.enum(["true", "false"]).default("true"),
    HB_UPLOAD_MAX_FILE_MB: z.coerce.number().positive().max(4096).default(60),
    HB_UPLOAD_MAX_TOTAL_MB: z.coerce.number().positive().max(65536).default(1024),
    HB_UPLOAD_MAX_FILES: z.coerce.number().int().positive().max(100000).default(2000),
  })
  .superRefine((v, ctx) => {
    if (v.HB_STORAGE === "s3")
      for (const k of ["HB_S3_BUCKET", "HB_S3_ACCESS_KEY_ID", "HB_S3_SECRET_ACCESS_KEY"] as const)
        if (!v[k]) ctx.addIssue({ code: "custom", path: [k], message: "required when HB_STORAGE=s3" });
  });

export type StorageSettings = {
  dataDir: string;
  tmpDir: string;
  maxFileBytes: number;
  maxTotalBytes: number;
  maxFiles: number;
};

let cached: { settings: StorageSettings; storage: FileStorage } | undefined;

export function storageSettingsFrom(envVars: NodeJS.ProcessEnv): { settings: StorageSettings; storage: FileStorage } {
  const parsed = schema.safeParse(envVars);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`);
    throw new Error(`Hiltbench's file storage is misconfigured; fix these settings:\n${lines.join("\n")}`);
  }
  const v = parsed.data;
  const dataDir = path.resolve(v.HB_DATA_DIR);
  const tmpDir = path.join(dataDir, "files", "tmp");
  const settings = { dataDir, tmpDir, maxFileBytes: v.HB_UPLOAD_MAX_FILE_MB * MB, maxTotalBytes: v.HB_UPLOAD_MAX_TOTAL_MB * MB, maxFiles: v.HB_UPLOAD_MAX_FILES };
  const storage: FileStorage =
    v.HB_STORAGE === "s3"
      ? new S3Storage(
          { endpoint: v.HB_S3_ENDPOINT, region: v.HB_S3_REGION, bucket: v.HB_S3_BUCKET!, accessKeyId: v.HB_S3_ACCESS_KEY_ID!, secretAccessKey: v.HB_S3_SECRET_ACCESS_KEY!, forcePathStyle: v.HB_S3_PATH_STYLE === "true" },
          tmpDir,
        )
      : new DiskStorage(path.join(dataDir, "files"));
  return { settings, storage };
}

export function storage(): FileStorage {
  return (cached ??= storageSettingsFrom(process.env)).storage;
}

export function storageSettings(): StorageSettings {
  return (cached ??= storageSettingsFrom(process.env)).settings;
}

