/**
 * `npm run bench`: the engine, estimator-advisor, import and upload row-count benchmarks, each in its own process so one
 * cannot skew the other's memory or timings. Exits non-zero when either fails (an error, a
 * mismatch or a missed goal); both run regardless, so every figure is printed.
 */
import { spawn } from "node:child_process";
import path from "node:path";

const ROOT = path.resolve(import.meta.dirname, "../..");
// The row-count bench calls lib/imports directly: those modules are server-only, hence the react-server condition.
const BENCHES = [
  ["tests/bench/engine.bench.ts"],
  ["tests/bench/advisor.bench.ts"],
  ["tests/bench/import.bench.ts"],
  ["--conditions=react-server", "tests/bench/row-count.bench.ts"],
];

function runBench(args: string[]): Promise<number> {
  const file = args.at(-1)!;
  return new Promise((resolve) => {
    const child = spawn(path.join(ROOT, "node_modules/.bin/tsx"), [...args, ...process.argv.slice(2)], {
      cwd: ROOT,
      stdio: "inherit",
    });
    child.on("error", (err) => {
      console.error(`bench: could not start ${file}: ${err.message}`);
      resolve(1);
    });
    child.on("exit", (code, signal) => resolve(code ?? (signal ? 1 : 0)));
  });
}

async function main(): Promise<void> {
  const failed: string[] = [];
  for (const args of BENCHES) {
    const file = args.at(-1)!;
    console.log(`\n=== ${file} ===`);
    const code = await runBench(args);
    if (code !== 0) failed.push(`${file} (exit ${code})`);
  }
  console.log(failed.length ? `\nbench: FAILED — ${failed.join(", ")}` : "\nbench: all benchmarks passed");
  process.exitCode = failed.length ? 1 : 0;
}

void main();
