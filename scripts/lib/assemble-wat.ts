// Assembles a WebAssembly text file with wabt (the WebAssembly Binary Toolkit's own parser,
// built for JavaScript), so our kernels are written as text and never as hand-counted bytes.
import wabtInit from "wabt";

export async function assembleWat(name: string, text: string): Promise<Uint8Array> {
  const wabt = await wabtInit();
  const parsed = wabt.parseWat(name, text, { simd: true });
  try {
    parsed.validate();
    return new Uint8Array(parsed.toBinary({ log: false, write_debug_names: false }).buffer);
  } finally {
    parsed.destroy();
  }
}
