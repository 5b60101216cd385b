import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";

// Playwright runs from the project root (its config lives there).
const ROOT = process.cwd();
const HTTP_METHODS = ["GET", "HEAD", "POST", "PUT", "PATCH", "DELETE", "OPTIONS"] as const;

function walk(dir: string, keep: (file: string) => boolean): string[] {
  const out: string[] = [];
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) out.push(...walk(full, keep));
    else if (keep(full)) out.push(full);
  }
  return out;
}

/** The URL pattern of a route file: its folders under app/, route groups such as (workspace) left out. */
function urlPatternOf(file: string): string {
  const segments = path.relative(path.join(ROOT, "app"), path.dirname(file)).split(path.sep);
  return "/" + segments.filter((s) => !/^\(.*\)$/.test(s)).join("/");
}

/** The HTTP methods a route file exports (`export const GET`, `export async function POST`, `export { h as GET }`). */
export function exportedMethods(source: string): string[] {
  const found = new Set<string>();
  for (const m of source.matchAll(/export\s+(?:const|let|async\s+function|function)\s+([A-Z]+)\b/g)) found.add(m[1]);
  for (const m of source.matchAll(/export\s*\{([^}]*)\}/g)) {
    for (const part of m[1].split(","))
      found.add(
        part
          .split(/\s+as\s+/)
          .pop()!
          .trim(),
      );
  }
  return HTTP_METHODS.filter((method) => found.has(method));
}

/** Every route handler under app/ as "METHOD /url/[param]". */
export function discoverRouteHandlers(): string[] {
  const files = walk(path.join(ROOT, "app"), (f) => /[\\/]route\.(ts|tsx|js|mjs)$/.test(f));
  return files
    .flatMap((file) => exportedMethods(readFileSync(file, "utf8")).map((method) => `${method} ${urlPatternOf(file)}`))
    .sort();
}

/** Every server action: each export of a "use server" module, and each function marked "use server" inline. */
export function discoverServerActions(): string[] {
  const dirs = ["app", "components", "lib"].map((d) => path.join(ROOT, d));
  const files = dirs.flatMap((d) => walk(d, (f) => /\.(ts|tsx)$/.test(f)));
  const actions: string[] = [];
  for (const file of files) {
    const source = readFileSync(file, "utf8");
    if (!/["']use server["']/.test(source)) continue;
    const rel = path.relative(ROOT, file);
    const moduleLevel = /^\s*(?:\/\/.*\n|\/\*[\s\S]*?\*\/\s*)*["']use server["']/.test(source);
    const names = moduleLevel
      ? [...source.matchAll(/export\s+(?:const|async\s+function|function)\s+(\w+)/g)].map((m) => m[1])
      : [...source.matchAll(/(?:async\s+function\s+(\w+)|const\s+(\w+)\s*=\s*async)[^{]*\{\s*["']use server["']/g)].map(
          (m) => m[1] ?? m[2],
        );
    actions.push(...names.map((name) => `action ${rel}#${name}`));
  }
  return actions.sort();
}
