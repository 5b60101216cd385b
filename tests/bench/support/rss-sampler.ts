import { readdirSync, readFileSync } from "node:fs";

/** kB values of VmRSS and VmHWM from /proc/<pid>/status, or null when the process is gone. */
function readMemory(pid: number): { rssKb: number; hwmKb: number } | null {
  try {
    const status = readFileSync(`/proc/${pid}/status`, "utf8");
    const rss = /VmRSS:\s+(\d+) kB/.exec(status);
    const hwm = /VmHWM:\s+(\d+) kB/.exec(status);
    return { rssKb: rss ? Number(rss[1]) : 0, hwmKb: hwm ? Number(hwm[1]) : 0 };
  } catch {
    return null;
  }
}

/** The pid and all its descendants, found through /proc/<pid>/task/<tid>/children. */
export function processTree(pid: number): number[] {
  const seen = [pid];
  for (let i = 0; i < seen.length; i += 1) {
    let tasks: string[] = [];
    try {
      tasks = readdirSync(`/proc/${seen[i]}/task`);
    } catch {
      continue;
    }
    for (const tid of tasks) {
      try {
        for (const child of readFileSync(`/proc/${seen[i]}/task/${tid}/children`, "utf8").trim().split(/\s+/)) {
          if (child) seen.push(Number(child));
        }
      } catch {
        /* task ended */
      }
    }
  }
  return seen;
}

export interface MemoryReport {
  /** Largest sum of VmRSS over the process tree seen by the sampler, in MB. */
  peakRssMb: number;
  /** Largest VmHWM (lifetime peak RSS) of any one process of the tree, in MB. */
  peakHwmMb: number;
  samples: number;
}

/** Samples the memory of a process tree every `intervalMs` until stopped. */
export function sampleMemory(pid: number, intervalMs = 50): { stop(): MemoryReport } {
  let peakRssKb = 0;
  let peakHwmKb = 0;
  let samples = 0;
  const tick = () => {
    let sum = 0;
    for (const p of processTree(pid)) {
      const m = readMemory(p);
      if (!m) continue;
      sum += m.rssKb;
      peakHwmKb = Math.max(peakHwmKb, m.hwmKb);
    }
    peakRssKb = Math.max(peakRssKb, sum);
    samples += 1;
  };
  tick();
  const timer = setInterval(tick, intervalMs);
  return {
    stop() {
      clearInterval(timer);
      tick();
      return { peakRssMb: peakRssKb / 1024, peakHwmMb: peakHwmKb / 1024, samples };
    },
  };
}
