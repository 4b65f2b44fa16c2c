// Events in time and the blade state they imply. A timeline is a plain list of events; the
// engine reads it without sorting or allocating, so the live preview can append to it freely.
import type { BladeEvent } from "~/lib/config/schema";

export interface TimelineEvent {
  event: BladeEvent;
  atMs: number;
  /** End of a lasting event (lockup, drag, a held auxiliary). Missing = still held. */
  untilMs?: number;
}
export type Timeline = readonly TimelineEvent[];

const FRAME_MS = 1000 / 60;

/** Seed used for every server-side figure and picture of the sequence, so the same config always gives the same numbers. */
export const SEQUENCE_SEED = 1;

/**
 * The demonstration sequence, the one run everywhere a look is shown without a user at the
 * buttons (time-by-pixel picture, power figures, handoff previews): ignition at 0, idle, clash,
 * blast, two seconds of lockup, a pause, retraction, and time for the retraction to finish.
 */
export const DEMO_SEQUENCE: Timeline = Object.freeze([
  Object.freeze({ event: "ignition", atMs: 0 }),
  Object.freeze({ event: "clash", atMs: 1500 }),
  Object.freeze({ event: "blast", atMs: 2500 }),
  Object.freeze({ event: "lockup", atMs: 3500, untilMs: 5500 }),
  Object.freeze({ event: "retraction", atMs: 6500 }),
]) as Timeline;
export const DEMO_SEQUENCE_MS = 7500;
/** Frames of the demonstration sequence at 60 frames per second (t = i·1000/60 for i < count). */
export const DEMO_SEQUENCE_FRAMES = Math.ceil(DEMO_SEQUENCE_MS / FRAME_MS);

/** Start of the latest `event` at or before `t`, or NaN when there is none. */
export function latestEventAt(timeline: Timeline, event: BladeEvent, t: number): number {
  let best = NaN;
  for (let i = 0; i < timeline.length; i++) {
    const e = timeline[i];
    if (e.event === event && e.atMs <= t && !(e.atMs <= best)) best = e.atMs;
  }
  return best;
}

/** Start of the latest `event` that is held at `t` (atMs ≤ t < untilMs), or NaN. */
export function heldSince(timeline: Timeline, event: BladeEvent, t: number): number {
  let best = NaN;
  for (let i = 0; i < timeline.length; i++) {
    const e = timeline[i];
    if (e.event !== event || !(e.atMs <= t)) continue;
    const until = e.untilMs;
    if (until !== undefined && !(t < until)) continue;
    if (!(e.atMs <= best)) best = e.atMs;
  }
  return best;
}

/** Where the blade stands at one instant. Reused between calls: read it, don't keep it. */
export interface BladeState {
  lit: boolean;
  /** Time of the ignition (when lit) or retraction (when unlit) that set the state; NaN before any ignition. */
  sinceMs: number;
}

/**
 * Unlit before the first ignition; lit from an ignition until the next retraction. A retraction
 * that comes while already unlit changes nothing (it keeps the earlier one's time), and so does a
 * second ignition while lit — the blade does not re-ignite.
 */
export function bladeStateAt(timeline: Timeline, t: number, out: BladeState): BladeState {
  // Walk events in time order without sorting: repeatedly take the next one after `cursor`.
  let lit = false;
  let since = NaN;
  let cursor = -Infinity;
  for (;;) {
    let next = Infinity;
    let nextIsIgnition = false;
    for (let i = 0; i < timeline.length; i++) {
      const e = timeline[i];
      if (e.event !== "ignition" && e.event !== "retraction") continue;
      const at = e.atMs;
      if (!(at > cursor) || !(at <= t)) continue;
      // At equal times a retraction is taken after an ignition, so the later state wins.
      if (at < next || (at === next && e.event === "ignition")) {
        next = at;
        nextIsIgnition = e.event === "ignition";
      }
    }
    if (next === Infinity) break;
    // Both kinds at one instant: ignition first, then the retraction at the same time.
    const both = hasEventAt(timeline, next, nextIsIgnition ? "retraction" : "ignition");
    if (nextIsIgnition && !lit) {
      lit = true;
      since = next;
    }
    if ((!nextIsIgnition || both) && lit) {
      lit = false;
      since = next;
    }
    cursor = next;
  }
  out.lit = lit;
  out.sinceMs = since;
  return out;
}

function hasEventAt(timeline: Timeline, at: number, event: BladeEvent): boolean {
  for (let i = 0; i < timeline.length; i++) if (timeline[i].event === event && timeline[i].atMs === at) return true;
  return false;
}
