// One channel drawn as its LEDs: the main blade as a tall strip (tip at the top), shorter strips
// across, one canvas pixel per LED scaled up without smoothing, with a blurred copy behind it for
// the glow a diffuser gives. Frames arrive through `draw` (60 times a second from LivePreview)
// or once through the `frame` prop (still pictures), never through React state.
import { useEffect, useImperativeHandle, useRef, type Ref } from "react";
import type { Channel } from "~/lib/config/schema";

export interface ChannelPreviewHandle {
  draw(frame: Uint8ClampedArray): void;
}

export function ChannelPreview({
  channel,
  frame,
  ref,
  length = 420,
  className = "",
}: {
  channel: Channel;
  /** RGB bytes, 3 per pixel, base first (an engine frame). */
  frame?: Uint8ClampedArray;
  ref?: Ref<ChannelPreviewHandle>;
  /** On-screen length of a strip in CSS pixels. */
  length?: number;
  className?: string;
}) {
  const n = Math.max(1, channel.pixels);
  const vertical = channel.role === "main-blade";
  const single = n === 1;
  const sharp = useRef<HTMLCanvasElement>(null);
  const glow = useRef<HTMLCanvasElement>(null);
  const image = useRef<ImageData | null>(null);

  function draw(f: Uint8ClampedArray) {
    const a = sharp.current?.getContext("2d");
    const b = glow.current?.getContext("2d");
    if (!a) return;
    let img = image.current;
    if (img === null || img.data.length !== n * 4) img = image.current = a.createImageData(vertical ? 1 : n, vertical ? n : 1);
    const d = img.data;
    for (let i = 0; i < n; i++) {
      // Tip at the top of a vertical blade: canvas row 0 shows the last pixel.
      const o = (vertical ? n - 1 - i : i) * 4;
      d[o] = f[i * 3] ?? 0;
      d[o + 1] = f[i * 3 + 1] ?? 0;
      d[o + 2] = f[i * 3 + 2] ?? 0;
      d[o + 3] = 255;
    }
    a.putImageData(img, 0, 0);
    b?.putImageData(img, 0, 0);
  }

  useImperativeHandle(ref, () => ({ draw }));
  useEffect(() => {
    if (frame) draw(frame);
  });

  const w = vertical ? 1 : n;
  const h = vertical ? n : 1;
  const box = vertical
    ? { width: 18, height: length }
    : single
      ? { width: 28, height: 28 }
      : { width: Math.min(length, n * 28), height: 18 };
  const shape = single ? "rounded-full" : "rounded-sm";
  return (
    <div className={`relative inline-block ${className}`} style={box}>
      <canvas
        ref={glow}
        width={w}
        height={h}
        aria-hidden="true"
        className={`pointer-events-none absolute inset-0 h-full w-full ${shape} opacity-60 blur-md`}
        style={{ imageRendering: "pixelated", transform: vertical ? "scaleX(2.4)" : single ? "scale(1.8)" : "scaleY(2.4)" }}
      />
      <canvas
        ref={sharp}
        width={w}
        height={h}
        role="img"
        aria-label={`${channel.name}: ${channel.pixels} pixel${channel.pixels === 1 ? "" : "s"}${channel.parallelStrips > 1 ? `, ${channel.parallelStrips} strips in parallel showing the same frame` : ""}`}
        className={`relative h-full w-full ${shape} border border-soot-600 bg-black`}
        style={{ imageRendering: "pixelated" }}
      />
    </div>
  );
}
