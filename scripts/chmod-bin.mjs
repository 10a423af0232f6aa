// Makes the compiled CLI entry executable, so `npm ci` leaves a working `hawser` binary.
import { chmodSync, existsSync } from "node:fs";

const bin = new URL("../dist/cli/main.js", import.meta.url);
if (existsSync(bin)) chmodSync(bin, 0o755);
