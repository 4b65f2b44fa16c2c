// The WAV reader's shared types (apart from riff.ts so the sample scanner needs no cycle back).
export type Severity = "error" | "warning" | "info";
export type AudioFinding = { severity: Severity; code: string; message: string };

export type WavEncoding = "pcm" | "float";
export type WavFormat = {
  /** The fmt chunk's format tag: 1 PCM, 3 IEEE float, 0xFFFE extensible. */
  formatTag: number;
  extensible: boolean;
  /** What the samples are (for extensible files, from the SubFormat GUID). */
  encoding: WavEncoding | null;
  subFormat: string | null;
  channels: number;
  sampleRate: number;
  bitsPerSample: number;
  validBits: number;
  blockAlign: number;
  byteRate: number;
  channelMask: number | null;
};

