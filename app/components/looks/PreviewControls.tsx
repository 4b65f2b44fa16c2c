// The live preview's buttons: moment events fire on click; lockup, drag and auxiliary are held
// for as long as the pointer or the key (Space / Enter) is down, like the hilt's own buttons.
import { useRef, type KeyboardEvent } from "react";
import type { BladeEvent } from "~/lib/config/schema";

export function FireButton({ label, onFire, disabled }: { label: string; onFire: () => void; disabled?: boolean }) {
  return (
    <button type="button" className="btn" onClick={onFire} disabled={disabled}>
      {label}
    </button>
  );
}

export function HoldButton({
  label,
  event,
  held,
  onPress,
  onRelease,
}: {
  label: string;
  event: BladeEvent;
  held: boolean;
  onPress: (e: BladeEvent) => void;
  onRelease: (e: BladeEvent) => void;
}) {
  const down = useRef(false);
  const start = () => {
    if (down.current) return;
    down.current = true;
    onPress(event);
  };
  const stop = () => {
    if (!down.current) return;
    down.current = false;
    onRelease(event);
  };
  const isKey = (e: KeyboardEvent) => e.key === " " || e.key === "Enter";
  return (
    <button
      type="button"
      className={`btn select-none touch-none ${held ? "border-brass-400 bg-soot-700 text-brass-300" : ""}`}
      aria-pressed={held}
      title="Hold to keep it going"
      onPointerDown={(e) => {
        e.currentTarget.setPointerCapture(e.pointerId);
        start();
      }}
      onPointerUp={stop}
      onPointerCancel={stop}
      onLostPointerCapture={stop}
      onKeyDown={(e) => {
        if (!isKey(e)) return;
        e.preventDefault();
        if (!e.repeat) start();
      }}
      onKeyUp={(e) => {
        if (!isKey(e)) return;
        e.preventDefault();
        stop();
      }}
      onBlur={stop}
    >
      {label} <span className="text-xs text-iron-400">(hold)</span>
    </button>
  );
}
