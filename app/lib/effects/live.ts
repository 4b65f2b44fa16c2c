// The live preview's clock and event log, as plain data: the buttons press and release events at
// the current time, the clock runs or pauses, the scrubber seeks. The engine reads `events` as an
// ordinary timeline, so scrubbing back replays what was recorded.
import type { BladeEvent } from "~/lib/config/schema";
import { bladeStateAt, DEMO_SEQUENCE, DEMO_SEQUENCE_MS, type BladeState, type Timeline, type TimelineEvent } from "./timeline";

export interface LiveSession {
  events: TimelineEvent[];
  timeMs: number;
  playing: boolean;
}

/** Longest step the clock takes at once: a tab that slept does not jump the blade ahead by minutes. */
export const MAX_STEP_MS = 250;

export function createLiveSession(timeline: Timeline = [], playing = true): LiveSession {
  return { events: timeline.map((e) => ({ ...e })), timeMs: 0, playing };
}

/** Starts the demonstration sequence from its beginning. */
export function loadDemoSequence(s: LiveSession): void {
  s.events = DEMO_SEQUENCE.map((e) => ({ ...e }));
  s.timeMs = 0;
  s.playing = true;
}

export function advance(s: LiveSession, dtMs: number): void {
  if (!s.playing || !(dtMs > 0)) return;
  s.timeMs += Math.min(dtMs, MAX_STEP_MS);
}

export function seek(s: LiveSession, timeMs: number): void {
  s.timeMs = Number.isFinite(timeMs) ? Math.max(0, timeMs) : 0;
}

/** Recording over the future: what was recorded after now is dropped before a new event goes in. */
function dropFuture(s: LiveSession): void {
  s.events = s.events.filter((e) => e.atMs <= s.timeMs);
}

/** A moment event (ignition, retraction, clash, blast, auxiliary press) at the current time. */
export function fire(s: LiveSession, event: BladeEvent): void {
  dropFuture(s);
  s.events.push({ event, atMs: s.timeMs, untilMs: event === "auxiliary" ? s.timeMs : undefined });
}

/** Starts holding a lasting event (lockup, drag, auxiliary) until `release`. */
export function press(s: LiveSession, event: BladeEvent): void {
  if (isHeld(s, event)) return;
  dropFuture(s);
  s.events.push({ event, atMs: s.timeMs });
}

export function release(s: LiveSession, event: BladeEvent): void {
  for (const e of s.events) if (e.event === event && e.untilMs === undefined && e.atMs <= s.timeMs) e.untilMs = s.timeMs;
}

export function isHeld(s: LiveSession, event: BladeEvent): boolean {
  return s.events.some((e) => e.event === event && e.atMs <= s.timeMs && (e.untilMs === undefined || s.timeMs < e.untilMs));
}

export function bladeLit(s: LiveSession): boolean {
  const state: BladeState = { lit: false, sinceMs: NaN };
  return bladeStateAt(s.events, s.timeMs, state).lit;
}

/** Length the scrubber spans: the demonstration sequence, or further when the session ran longer. */
export function horizonMs(s: LiveSession): number {
  let end = Math.max(DEMO_SEQUENCE_MS, s.timeMs);
  for (const e of s.events) end = Math.max(end, e.atMs, e.untilMs ?? 0);
  return Math.ceil(end / 500) * 500;
}
