export { buildKb } from "../src/kb/build.js";
export { openKb } from "../src/kb/kb.js";
export { createLinker } from "../src/link/linker.js";
