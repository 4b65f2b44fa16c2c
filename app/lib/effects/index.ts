// The effect engine's public surface for browser and server alike. PNG encoding is not here:
// import it from "./png.server" on the server only.
export * from "./color";
export * from "./composite";
export * from "./engine";
export * from "./image";
export * from "./power";
export * from "./timeline";
export { breatheLevel } from "./paint";
export { ease, wipeExtent, HOLD_FLICKER_HZ } from "./events";
