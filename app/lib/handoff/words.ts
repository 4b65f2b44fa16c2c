// What a client reads about their build: its stage in plain words, and sizes as people say them.
// Pure: no request, no database.
import type { BuildStatus } from "../db/types";

export type StageWords = { label: string; detail: string };

const STAGES: Record<BuildStatus, StageWords> = {
  intake: { label: "Received", detail: "The workshop has your order and is looking at your hilt and your wishes." },
  configuring: { label: "Being set up", detail: "The workshop is fitting the parts and composing the looks and sounds of each preset." },
  "in-review": { label: "Being checked", detail: "A second person in the workshop is reading the setup before it goes on the card." },
  approved: { label: "Checked, bench test next", detail: "The setup is approved; the workshop tests every effect on the bench before handing it over." },
  released: { label: "Ready", detail: "Your saber's card is released: download it below, or find it on the card that came with the saber." },
};

/**
 * The stage of a build for its client. A build with a release is ready whatever its status says
 * since (a later change goes back through the workshop's steps, but the released card stands).
 */
export function stageInWords(status: BuildStatus, released: boolean): StageWords {
  if (released && status !== "released") return { label: "Ready", detail: `${STAGES.released.detail} The workshop is working on a change (${STAGES[status].label.toLowerCase()}).` };
  return STAGES[status];
}

/** Bytes as a client reads them: decimal units, as card and file sizes are sold (1 MB = 1,000,000 bytes). */
export function sizeInWords(bytes: number): string {
  if (bytes < 1000) return `${bytes} bytes`;
  const units = ["kB", "MB", "GB"];
  let v = bytes / 1000;
  let i = 0;
  while (v >= 1000 && i < units.length - 1) {
    v /= 1000;
    i++;
  }
  return `${v >= 100 ? v.toFixed(0) : v.toFixed(1)} ${units[i]} (${bytes.toLocaleString("en-GB")} bytes)`;
}
