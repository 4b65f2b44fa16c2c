// The font upload as one call for routes: receive (stream, caps, zip checks), accept (checks,
// storage, one transaction with the config save), and always remove the staging folder.
import { rm } from "node:fs/promises";
import type { Viewer } from "../auth/auth.server";
import { db } from "../db/db.server";
import { filesOfUpload, latestUploads, listLayouts, saveLayout, storedFileOfBuild } from "../repo/fonts.server";
import { storage, storageSettings } from "../storage/settings.server";
import { acceptUpload, type Accepted } from "./accept.server";
import { DEFAULT_LAYOUT, fontLayoutSchema, type FontLayout } from "./layout";
import { receiveUpload } from "./receive.server";

export async function layoutsFor(workshopId: string): Promise<FontLayout[]> {
  const own = await listLayouts(db(), workshopId);
  const parsed = own.flatMap((l) => {
    const r = fontLayoutSchema.safeParse({ name: l.name, rules: l.rules });
    return r.success ? [r.data] : [];
  });
  return [DEFAULT_LAYOUT, ...parsed];
}

export async function uploadFont(v: Viewer, buildId: string, fontId: string, request: Request): Promise<Accepted> {
  const settings = storageSettings();
  const received = await receiveUpload(request, settings, settings.tmpDir);
  try {
    const layouts = await layoutsFor(v.workshop.id);
    const layout = layouts.find((l) => l.name === received.fields.layout) ?? DEFAULT_LAYOUT;
    return await acceptUpload(db(), storage(), { workshopId: v.workshop.id, buildId, fontId, userId: v.user.id, layout, files: received.files, ignored: received.ignored });
  } finally {
    await rm(received.dir, { recursive: true, force: true });
  }
}

/** The Fonts tab's rows: each font's newest upload and its files. */
export async function fontUploadsOf(buildId: string) {
  const uploads = await latestUploads(db(), buildId);
  return Promise.all(uploads.map(async (u) => ({ upload: u, files: await filesOfUpload(db(), u.id) })));
}

export function saveWorkshopLayout(v: Viewer, layout: FontLayout) {
  return saveLayout(db(), v.workshop.id, layout.name, layout.rules);
}

export function fontFileOfBuild(buildId: string, sha256: string) {
  return storedFileOfBuild(db(), buildId, sha256);
}
