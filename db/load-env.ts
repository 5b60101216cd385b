import fs from "node:fs";
import path from "node:path";

/** Loads .env.local for scripts run outside Next (Next loads it itself); existing variables win. */
export function loadLocalEnv(root = path.resolve(import.meta.dirname, "..")): void {
  const file = path.join(root, ".env.local");
  if (!fs.existsSync(file)) return;
  const saved = { ...process.env };
  process.loadEnvFile(file);
  Object.assign(process.env, saved);
}
