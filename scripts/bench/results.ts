import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import type { LedgerCheck } from '../../packages/db/src/bench-seed';
import type { LoadRun } from './load';
import type { ReportsMeasurement } from './reports';
import type { WebSize } from './web-size';

// The bench's figures as JSON (everything) and as a short markdown table (the goals and the load runs).

export interface Goal {
  id: string;
  goal: string;
  measured: string;
  /** null: not measured in this run. */
  met: boolean | null;
}

type Runs = Record<number, LoadRun>;

/** One pair of redemption runs, API and bare, made one after the other. */
export interface RedemptionRound {
  round: number;
  connections: number;
  api: LoadRun;
  bare: LoadRun;
  throughputRatio: number;
  p99Ratio: number;
}

export interface BenchResults {
  ranAt: string;
  machine: { cpu: string; cores: number; memoryGb: number; node: string; mariadb: string; os: string; loadAverage: { start: number[]; end: number[] } };
  settings: { secondsPerRun: number; warmupSeconds: number; maxRequestsPerRun: number; redemptionRounds: number; dbPoolSize: number; apiBuiltAt: string; nodeFlags: string[] };
  dataset: {
    rinks: number;
    sharpenings: number;
    ledgerEntries: number;
    reused: boolean;
    seededAt: string;
    seedSeconds: number;
    counts: Record<string, number>;
    largeRink: { name: string; slug: string; timeZone: string; stations: number; customers: number };
    ledger: LedgerCheck;
  };
  redemption: {
    /** The runs of the round each goal was judged on (see `rounds`). */
    api: Runs;
    bare: Runs;
    rounds: RedemptionRound[];
    correctness: Record<'api' | 'bare', { granted: number; redeemed: number; answered201: number; cutOff: number; finalBalance: number; exact: boolean; ledger: LedgerCheck }>;
  };
  counter: Record<string, Runs>;
  reports: ReportsMeasurement;
  web: WebSize | null;
  goals: Goal[];
}

const fmt = (n: number) => n.toLocaleString('en-US');
const verdict = (met: boolean | null) => (met === null ? 'not measured' : met ? 'yes' : 'no');

export function toMarkdown(r: BenchResults): string {
  const m = r.machine;
  const d = r.dataset;
  const lines = [
    `Measured by \`pnpm bench\` on ${r.ranAt.slice(0, 10)}: ${m.cpu}, ${m.cores} cores, ${m.memoryGb} GB, Node ${m.node}, MariaDB ${m.mariadb} (load average ${m.loadAverage.start.join(' / ')} at the start). ` +
      `The load generator (autocannon) runs on the same machine over loopback; each run lasts ${r.settings.secondsPerRun} s after a ${r.settings.warmupSeconds} s warm-up. ` +
      `The redemption runs come from the median of ${r.settings.redemptionRounds} rounds at each connection count, each round an API and a bare run one after the other, which of them first alternating. ` +
      `CPU stolen is the share of the machine's CPU time that the hypervisor gave to other guests during a run (steal in /proc/stat): the more was stolen, the less of the machine the run had. ` +
      `Data set: ${fmt(d.rinks)} rinks, ${fmt(d.sharpenings)} sharpenings, ${fmt(d.ledgerEntries)} ledger entries (seeded in ${d.seedSeconds} s).`,
    '',
    '| Goal | Measured | Met |',
    '|---|---|---|',
    ...r.goals.map((g) => `| ${g.goal} | ${g.measured} | ${verdict(g.met)} |`),
    '',
    '| Load run | Connections | 2xx per second | p50 (ms) | p99 (ms) | non-2xx | CPU stolen (%) |',
    '|---|---|---|---|---|---|---|',
  ];
  const runs = [
    ...Object.values(r.redemption.bare),
    ...Object.values(r.redemption.api),
    ...Object.values(r.counter).flatMap((byConnections) => Object.values(byConnections)),
  ];
  for (const run of runs) lines.push(`| ${run.label.replace(/, \d+ connections$/, '')} | ${run.connections} | ${fmt(run.okPerSecond)} | ${run.latencyMs.p50} | ${run.latencyMs.p99} | ${run.non2xx + run.errors} | ${run.cpuStolenPercent ?? '–'} |`);
  if (r.reports.available) {
    lines.push('', '| Report (90 days, large rink) | p50 (ms) | p95 (ms) |', '|---|---|---|');
    lines.push(`| throughput | ${r.reports.throughput.p50} | ${r.reports.throughput.p95} |`);
    lines.push(`| quality | ${r.reports.quality.p50} | ${r.reports.quality.p95} |`);
    lines.push(`| naive query over the raw rows | ${r.reports.naive.p50} | ${r.reports.naive.p95} |`);
  }
  return `${lines.join('\n')}\n`;
}

export function writeResults(dir: string, results: BenchResults): { jsonFile: string; markdownFile: string; markdown: string } {
  mkdirSync(dir, { recursive: true });
  const jsonFile = path.join(dir, 'results.json');
  const markdownFile = path.join(dir, 'results.md');
  const markdown = toMarkdown(results);
  writeFileSync(jsonFile, `${JSON.stringify(results, null, 2)}\n`);
  writeFileSync(markdownFile, markdown);
  return { jsonFile, markdownFile, markdown };
}
