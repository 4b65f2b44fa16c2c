// Hiltbench's own streaming RIFF/WAVE reader. It walks the chunks as bytes arrive (push), never
// holds more than a small header in memory, and answers a report with findings instead of
// throwing: a font's files come from clients, and a broken one must be described, not crash us.
// Layout per the RIFF/WAVE specification (IBM/Microsoft Multimedia Programming Interface and Data
// Specifications 1.0, 1991) and Microsoft's WAVEFORMATEXTENSIBLE documentation.
import { createSampleScanner, type SampleScanner } from "./samples";

import type { AudioFinding, Severity, WavEncoding, WavFormat } from "./types";
export type { AudioFinding, Severity, WavEncoding, WavFormat } from "./types";

export type WavReport = {
  ok: boolean;
  format: WavFormat | null;
  /** Bytes of sample data actually present (never more than the data chunk claims). */
  dataBytes: number;
  frames: number;
  durationMs: number;
  /** Largest absolute sample as a fraction of full scale (0–1), and in dBFS. */
  peak: number;
  peakDbfs: number | null;
  clippedSamples: number;
  chunks: { id: string; offset: number; size: number }[];
  bytesRead: number;
  findings: AudioFinding[];
};

/** The GUID tail every standard SubFormat shares: xxxxxxxx-0000-0010-8000-00AA00389B71. */
const GUID_TAIL = [0x00, 0x00, 0x10, 0x00, 0x80, 0x00, 0x00, 0xaa, 0x00, 0x38, 0x9b, 0x71];
const MAX_CHUNKS = 4096;
const MAX_FMT_BYTES = 256;

type State =
  | { kind: "riff" }
  | { kind: "chunk-header" }
  | { kind: "fmt"; size: number; remaining: number }
  | { kind: "data"; size: number; remaining: number; offset: number }
  | { kind: "skip"; remaining: number; pad: boolean }
  | { kind: "done" };

export class WavReader {
  private state: State = { kind: "riff" };
  private head = new Uint8Array(MAX_FMT_BYTES);
  private headLen = 0;
  private pos = 0;
  /** Where the RIFF container says it ends (8 + its size). */
  private riffEnd = 0;
  private format: WavFormat | null = null;
  private scanner: SampleScanner | null = null;
  private findings: AudioFinding[] = [];
  private chunks: { id: string; offset: number; size: number }[] = [];
  private sawData = false;
  private dataClaimed = 0;
  private dataPresent = 0;

  private find(severity: Severity, code: string, message: string) {
    if (!this.findings.some((f) => f.code === code)) this.findings.push({ severity, code, message });
  }

  /** Feed the next bytes of the file. */
  push(bytes: Uint8Array): void {
    let i = 0;
    while (i < bytes.length && this.state.kind !== "done") i += this.step(bytes, i);
    this.pos += bytes.length;
  }

  /** Collect `need` header bytes into this.head; answers how many were taken and whether complete. */
  private collect(bytes: Uint8Array, at: number, need: number): { taken: number; full: boolean } {
    const taken = Math.min(need - this.headLen, bytes.length - at);
    this.head.set(bytes.subarray(at, at + taken), this.headLen);
    this.headLen += taken;
    return { taken, full: this.headLen === need };
  }

  private step(bytes: Uint8Array, at: number): number {
    const s = this.state;
    const abs = this.pos + at;
    switch (s.kind) {
      case "riff": {
        const { taken, full } = this.collect(bytes, at, 12);
        if (full) this.onRiffHeader();
        return taken;
      }
      case "chunk-header": {
        // RIFF says the container ends at riffEnd; anything after is not part of the file.
        if (this.headLen === 0 && abs >= this.riffEnd) {
          this.find("info", "trailing-bytes", "There are bytes after the end the RIFF header gives; they were ignored.");
          this.state = { kind: "done" };
          return 0;
        }
        const { taken, full } = this.collect(bytes, at, 8);
        if (full) this.onChunkHeader(abs + taken - 8);
        return taken;
      }
      case "fmt": {
        const want = Math.min(s.size, MAX_FMT_BYTES);
        if (this.headLen < want) {
          const { taken, full } = this.collect(bytes, at, want);
          s.remaining -= taken;
          if (full) this.onFmt(this.head.subarray(0, want));
          if (full && s.remaining === 0) this.afterChunk(s.size);
          return taken;
        }
        const taken = Math.min(s.remaining, bytes.length - at);
        s.remaining -= taken;
        if (s.remaining === 0) this.afterChunk(s.size);
        return taken;
      }
      case "data": {
        const taken = Math.min(s.remaining, bytes.length - at);
        if (this.scanner) this.scanner.scan(bytes, at, taken);
        s.remaining -= taken;
        this.dataPresent += taken;
        if (s.remaining === 0) this.afterChunk(s.size);
        return taken;
      }
      case "skip": {
        const taken = Math.min(s.remaining, bytes.length - at);
        s.remaining -= taken;
        if (s.remaining === 0) this.state = { kind: "chunk-header" };
        return taken;
      }
      case "done":
        return bytes.length - at;
    }
  }

  private onRiffHeader() {
    const h = this.head;
    const id = ascii(h, 0, 4);
    const size = u32(h, 4);
    const form = ascii(h, 8, 4);
    this.headLen = 0;
    if (id === "RIFX") return this.stop("error", "big-endian", "This is a big-endian RIFX file; boards read little-endian RIFF WAV files only.");
    if (id === "RF64") return this.stop("error", "rf64", "This is an RF64 (64-bit) WAV file; export it as an ordinary RIFF WAV under 4 GB.");
    if (id !== "RIFF") return this.stop("error", "not-riff", "The file does not start with a RIFF header, so it is not a WAV file.");
    if (form !== "WAVE") return this.stop("error", "not-wave", `The RIFF file holds "${printable(form)}" data, not WAVE audio.`);
    this.riffEnd = 8 + size;
    this.state = { kind: "chunk-header" };
  }

  private onChunkHeader(offset: number) {
    const id = ascii(this.head, 0, 4);
    const size = u32(this.head, 4);
    this.headLen = 0;
    if (!/^[\x20-\x7e]{4}$/.test(id)) {
      return this.stop("error", "garbled-chunk", `At byte ${offset} there is no readable chunk header; the chunk sizes before it are wrong or the file is damaged.`);
    }
    if (this.chunks.length >= MAX_CHUNKS) return this.stop("error", "too-many-chunks", `The file has more than ${MAX_CHUNKS} chunks; it is not an ordinary WAV file.`);
    this.chunks.push({ id, offset, size });
    if (offset + 8 + size > this.riffEnd && id !== "data")
      this.find("warning", "chunk-past-riff-end", `The "${printable(id)}" chunk runs past the end the RIFF header gives.`);
    if (id === "fmt ") {
      if (this.format) this.find("warning", "second-fmt", "The file has a second fmt chunk; the first one was used.");
      this.state = this.format ? { kind: "skip", remaining: size + (size & 1), pad: false } : { kind: "fmt", size, remaining: size };
      if (size === 0) this.afterChunk(0);
    } else if (id === "data") {
      if (this.sawData) {
        this.find("warning", "second-data", "The file has a second data chunk; only the first is played by most boards and was checked.");
        this.state = { kind: "skip", remaining: size + (size & 1), pad: false };
        return;
      }
      this.sawData = true;
      this.dataClaimed = size;
      if (!this.format) this.find("error", "data-before-fmt", "The data chunk comes before the fmt chunk, so a player cannot know how to read the samples.");
      else this.scanner = createSampleScanner(this.format);
      const left = this.riffEnd - (offset + 8);
      if (size > left)
        this.find("error", "data-size-lies", `The data chunk claims ${size.toLocaleString("en")} bytes, but the RIFF container leaves room for only ${Math.max(0, left).toLocaleString("en")}; the header lies about the sizes.`);
      this.state = { kind: "data", size, remaining: size, offset };
      if (size === 0) this.afterChunk(0);
    } else {
      this.state = { kind: "skip", remaining: size + (size & 1), pad: false };
      if (this.state.remaining === 0) this.state = { kind: "chunk-header" };
    }
  }

  /** After a chunk's body: skip its pad byte if the size is odd (RIFF pads chunks to even sizes). */
  private afterChunk(size: number) {
    this.headLen = 0;
    this.state = size & 1 ? { kind: "skip", remaining: 1, pad: true } : { kind: "chunk-header" };
  }

  private onFmt(b: Uint8Array) {
    if (b.length < 16) return this.find("error", "fmt-too-short", `The fmt chunk has ${b.length} bytes; it needs at least 16.`);
    const formatTag = u16(b, 0);
    const channels = u16(b, 2);
    const sampleRate = u32(b, 4);
    const byteRate = u32(b, 8);
    const blockAlign = u16(b, 12);
    const bitsPerSample = u16(b, 14);
    let encoding: WavEncoding | null = formatTag === 1 ? "pcm" : formatTag === 3 ? "float" : null;
    let validBits = bitsPerSample;
    let channelMask: number | null = null;
    let subFormat: string | null = null;
    const extensible = formatTag === 0xfffe;
    if (extensible) {
      const cbSize = b.length >= 18 ? u16(b, 16) : 0;
      if (b.length < 40 || cbSize < 22) {
        this.find("error", "extensible-too-short", `The fmt chunk says the format is extensible but carries ${cbSize} extra bytes; the extension needs 22.`);
      } else {
        validBits = u16(b, 18);
        channelMask = u32(b, 20);
        const guid = b.subarray(24, 40);
        subFormat = guidText(guid);
        const standardTail = GUID_TAIL.every((v, i) => guid[4 + i] === v);
        const sub = u32(guid, 0);
        encoding = standardTail && sub === 1 ? "pcm" : standardTail && sub === 3 ? "float" : null;
        if (!encoding) this.find("error", "unknown-subformat", `The extensible SubFormat ${subFormat} is neither PCM nor IEEE float; boards cannot play it.`);
        if (validBits === 0) validBits = bitsPerSample;
        if (validBits > bitsPerSample) this.find("error", "valid-bits-too-large", `The extension says ${validBits} valid bits in a ${bitsPerSample}-bit container, which cannot be.`);
        if (channelMask !== 0 && popcount(channelMask) !== channels)
          this.find("info", "channel-mask-mismatch", `The channel mask names ${popcount(channelMask)} speaker position(s) for ${channels} channel(s).`);
      }
    } else if (!encoding) {
      const name = CODEC_NAMES[formatTag] ?? `format tag 0x${formatTag.toString(16).padStart(4, "0")}`;
      this.find("error", "unsupported-encoding", `The audio is ${name}, not PCM or float; export it as uncompressed PCM.`);
    }
    const format: WavFormat = { formatTag, extensible, encoding, subFormat, channels, sampleRate, bitsPerSample, validBits, blockAlign, byteRate, channelMask };
    if (channels === 0) this.find("error", "no-channels", "The fmt chunk says the file has 0 channels.");
    if (sampleRate === 0) this.find("error", "no-sample-rate", "The fmt chunk says the sample rate is 0 Hz.");
    const okBits = encoding === "float" ? bitsPerSample === 32 || bitsPerSample === 64 : [8, 16, 24, 32].includes(bitsPerSample);
    if (encoding && !okBits) this.find("error", "unsupported-bit-depth", `${bitsPerSample}-bit ${encoding === "float" ? "float" : "PCM"} samples are not a standard WAV layout.`);
    // BlockAlign = channels × bytes per sample; ByteRate = sample rate × BlockAlign (RIFF/WAVE spec).
    const expectAlign = channels * Math.ceil(bitsPerSample / 8);
    if (channels > 0 && blockAlign !== expectAlign)
      this.find("warning", "block-align-mismatch", `The fmt chunk gives a block align of ${blockAlign}; ${channels} channel(s) of ${bitsPerSample} bits need ${expectAlign}.`);
    if (channels > 0 && sampleRate > 0 && byteRate !== sampleRate * expectAlign)
      this.find("warning", "byte-rate-mismatch", `The fmt chunk gives ${byteRate} bytes per second; ${sampleRate} Hz × ${expectAlign} bytes is ${sampleRate * expectAlign}.`);
    this.format = format;
  }

  private stop(severity: Severity, code: string, message: string) {
    this.find(severity, code, message);
    this.state = { kind: "done" };
  }

  /** The stream has ended: answer what was found. */
  finish(): WavReport {
    const s = this.state;
    const total = this.pos;
    if (s.kind === "riff") this.find("error", total === 0 ? "empty" : "too-short", total === 0 ? "The file is empty." : `The file has only ${total} bytes, too few for a WAV header.`);
    if (s.kind === "data" && s.remaining > 0) {
      this.find("error", "truncated", `The file ends ${s.remaining.toLocaleString("en")} bytes before its data chunk does (it has ${this.dataPresent.toLocaleString("en")} of ${s.size.toLocaleString("en")}); it was cut off or its header lies.`);
    } else if (s.kind === "fmt" || (s.kind === "chunk-header" && this.headLen > 0)) {
      this.find("error", "truncated", "The file ends in the middle of a chunk header; it was cut off.");
    } else if (s.kind === "skip" && !s.pad && s.remaining > 0 && this.riffEnd > total) {
      this.find("warning", "truncated-chunk", "The file ends inside a chunk after the audio; it was probably cut off.");
    } else if (s.kind === "skip" && s.pad) {
      this.find("info", "missing-pad-byte", "The last chunk has an odd size and no pad byte (RIFF pads chunks to even sizes); most players do not mind.");
    }
    if (this.riffEnd > 0 && total < this.riffEnd && !this.findings.some((f) => f.code === "truncated"))
      this.find("warning", "riff-size-beyond-file", `The RIFF header says the file has ${this.riffEnd.toLocaleString("en")} bytes, but it has ${total.toLocaleString("en")}.`);
    const started = s.kind !== "riff" && !this.findings.some((f) => ["not-riff", "not-wave", "big-endian", "rf64"].includes(f.code));
    if (started && !this.format && !this.findings.some((f) => f.code === "fmt-too-short")) this.find("error", "no-fmt", "The file has no fmt chunk, so nothing says how to read the samples.");
    if (started && !this.sawData) this.find("error", "no-data", "The file has no data chunk: there is no sound in it.");

    const f = this.format;
    const sc = this.scanner;
    const blockAlign = f ? f.channels * Math.ceil(f.bitsPerSample / 8) : 0;
    const frames = f && blockAlign > 0 ? Math.floor(this.dataPresent / blockAlign) : 0;
    if (f && blockAlign > 0 && this.dataPresent % blockAlign !== 0)
      this.find("warning", "partial-frame", `The data ends ${this.dataPresent % blockAlign} byte(s) into a frame; the last frame is incomplete.`);
    if (sc && sc.nonFinite > 0) this.find("error", "non-finite-samples", `${sc.nonFinite} float sample(s) are NaN or infinite.`);
    const peak = sc ? sc.peak() : 0;
    const ok = !this.findings.some((x) => x.severity === "error");
    return {
      ok,
      format: f,
      dataBytes: this.dataPresent,
      frames,
      durationMs: f && f.sampleRate > 0 ? (frames / f.sampleRate) * 1000 : 0,
      peak,
      peakDbfs: peak > 0 ? 20 * Math.log10(peak) : null,
      clippedSamples: sc ? sc.clipped : 0,
      chunks: this.chunks,
      bytesRead: total,
      findings: this.findings,
    };
  }
}

/** Read a whole byte array (tests, small files). */
export function readWav(bytes: Uint8Array): WavReport {
  const r = new WavReader();
  r.push(bytes);
  return r.finish();
}

const CODEC_NAMES: Record<number, string> = {
  2: "Microsoft ADPCM",
  6: "A-law",
  7: "µ-law",
  0x11: "IMA ADPCM",
  0x31: "GSM 6.10",
  0x50: "MPEG audio",
  0x55: "MP3",
  0xff: "AAC",
};

function u16(b: Uint8Array, i: number) {
  return b[i] | (b[i + 1] << 8);
}
function u32(b: Uint8Array, i: number) {
  return (b[i] | (b[i + 1] << 8) | (b[i + 2] << 16)) + b[i + 3] * 0x1000000;
}
function ascii(b: Uint8Array, i: number, n: number) {
  let s = "";
  for (let k = 0; k < n; k++) s += String.fromCharCode(b[i + k]);
  return s;
}
function printable(s: string) {
  return s.replace(/[^\x20-\x7e]/g, "?");
}
function popcount(n: number) {
  let c = 0;
  for (let x = n >>> 0; x; x >>>= 1) c += x & 1;
  return c;
}
function hex(n: number, w: number) {
  return n.toString(16).toUpperCase().padStart(w, "0");
}
/** A GUID as text: the first three groups are little-endian on disk, the last two are bytes. */
function guidText(g: Uint8Array) {
  const tail = [...g.subarray(8, 16)].map((v) => hex(v, 2)).join("");
  return `${hex(u32(g, 0), 8)}-${hex(u16(g, 4), 4)}-${hex(u16(g, 6), 4)}-${tail.slice(0, 4)}-${tail.slice(4)}`;
}
