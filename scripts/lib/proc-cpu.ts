import { readdirSync, readFileSync } from "node:fs";

/**
 * CPU time used by processes, from Linux's /proc (user + system, in ms; clock ticks of 10 ms). Elsewhere every
 * figure is null and the benchmarks print none.
 */
const TICK_MS = 10; // USER_HZ is 100 on Linux

interface ProcStat {
  pid: number;
  ppid: number;
  comm: string;
  cpuMs: number;
}

function readStat(pid: number): ProcStat | null {
  try {
    const text = readFileSync(`/proc/${pid}/stat`, "utf8");
    const close = text.lastIndexOf(")");
    const comm = text.slice(text.indexOf("(") + 1, close);
    const f = text.slice(close + 2).split(" "); // f[0] is field 3 (state)
    return { pid, ppid: Number(f[1]), comm, cpuMs: (Number(f[11]) + Number(f[12])) * TICK_MS };
  } catch {
    return null;
  }
}

function allStats(): ProcStat[] {
  let pids: number[];
  try {
    pids = readdirSync("/proc").filter((d) => /^\d+$/.test(d)).map(Number);
  } catch {
    return [];
  }
  return pids.map(readStat).filter((s): s is ProcStat => s !== null);
}

/** The CPU ms of a process and all its descendants (an app run as a cluster of workers), or null. */
export function treeCpuMs(rootPid: number | undefined): number | null {
  if (!rootPid) return null;
  const stats = allStats();
  if (stats.length === 0) return null;
  const byParent = new Map<number, ProcStat[]>();
  for (const s of stats) byParent.set(s.ppid, [...(byParent.get(s.ppid) ?? []), s]);
  const root = stats.find((s) => s.pid === rootPid);
  if (!root) return null;
  let total = 0;
  const todo = [root];
  while (todo.length) {
    const s = todo.pop()!;
    total += s.cpuMs;
    todo.push(...(byParent.get(s.pid) ?? []));
  }
  return total;
}

/** The CPU ms of every process with this command name (e.g. `mariadbd`), or null when none is found. */
export function commandCpuMs(comm: string): number | null {
  const found = allStats().filter((s) => s.comm === comm);
  return found.length ? found.reduce((a, s) => a + s.cpuMs, 0) : null;
}
