import { describe, expect, it } from 'vitest';
import { parseCpuTicks, stolenPercent } from './load';

// The field order of /proc/stat's cpu line is the one proc(5) documents (Linux man-pages, "/proc/stat"):
// user nice system idle iowait irq softirq steal guest guest_nice, in USER_HZ ticks; guest time is also counted
// in user, and guest_nice in nice. The two lines below were read five seconds apart on a 2-core cloud machine
// under load.
const BEFORE = 'cpu  747605 10996 144233 703219 10415 0 30071 24089 0 0\ncpu0 373802 5498 72116 351609 5207 0 15035 12044 0 0\n';
const AFTER = 'cpu  748091 10996 144320 703414 10444 0 30116 24334 0 0\n';

describe('CPU time stolen during a load run', () => {
  it('sums the first eight fields of the all-CPU line and takes the eighth as steal', () => {
    expect(parseCpuTicks(BEFORE)).toEqual({ total: 1_670_628, steal: 24_089 });
  });

  it('does not count guest time twice: it is already inside user', () => {
    expect(parseCpuTicks('cpu 100 0 50 800 0 0 0 50 30 0')).toEqual({ total: 1000, steal: 50 });
  });

  it('gives the stolen share of the ticks between two readings', () => {
    // 245 stolen of 1,087 ticks (486 user, 87 system, 195 idle, 29 iowait, 45 softirq, 245 steal): 22.5%.
    expect(stolenPercent(parseCpuTicks(BEFORE), parseCpuTicks(AFTER))).toBe(22.5);
    expect(stolenPercent(parseCpuTicks(AFTER), parseCpuTicks(AFTER))).toBe(0);
  });

  it('refuses text that is not the all-CPU line', () => {
    expect(() => parseCpuTicks('cpu0 1 2 3 4 5 6 7 8')).toThrow(/not the all-CPU line/);
    expect(() => parseCpuTicks('cpu 1 2 3')).toThrow(/not the all-CPU line/);
  });
});
