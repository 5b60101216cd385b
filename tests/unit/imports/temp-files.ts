import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll } from "vitest";

/** A temporary folder for one test file's fixtures, removed after the file's tests. */
export function fixtureFolder(): (name: string, content: string | Uint8Array) => string {
  const dir = mkdtempSync(path.join(tmpdir(), "sondage-imports-"));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  return (name, content) => {
    const file = path.join(dir, name);
    writeFileSync(file, content);
    return file;
  };
}
