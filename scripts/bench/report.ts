/** Shared helpers for the benchmarks: timing runs and printing one table per benchmark. */

export interface Timing {
  median: number;
  p95: number;
  min: number;
  max: number;
  runs: number;
}

/** Runs `fn` `warmup` times untimed, then `runs` times, and returns the timings in ms. */
export async function time(fn: () => unknown, runs = 20, warmup = 3): Promise<Timing> {
  for (let i = 0; i < warmup; i += 1) await fn();
  const samples: number[] = [];
  for (let i = 0; i < runs; i += 1) {
    const start = performance.now();
    await fn();
    samples.push(performance.now() - start);
  }
  return summarise(samples);
}

export function summarise(samples: number[]): Timing {
  const sorted = [...samples].sort((a, b) => a - b);
  const at = (q: number) => sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))];
  return { median: at(0.5), p95: at(0.95), min: sorted[0], max: sorted[sorted.length - 1], runs: sorted.length };
}

export interface Row {
  what: string;
  measured: string;
  target?: string;
  /** true met, false missed, undefined when there is no target. */
  met?: boolean;
}

export function printTable(rows: Row[]): void {
  const header = ['what', 'measured', 'target', 'met'];
  const cells = rows.map((row) => [row.what, row.measured, row.target ?? '', row.met === undefined ? '' : row.met ? 'yes' : 'NO']);
  const widths = header.map((title, column) => Math.max(title.length, ...cells.map((line) => line[column].length)));
  const line = (values: string[]) => `| ${values.map((value, column) => value.padEnd(widths[column])).join(' | ')} |`;
  console.log(line(header));
  console.log(`|${widths.map((width) => '-'.repeat(width + 2)).join('|')}|`);
  for (const values of cells) console.log(line(values));
}

export const ms = (value: number) => `${value.toFixed(value < 10 ? 2 : 1)} ms`;
