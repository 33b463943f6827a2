/**
 * A fixed scalar loop (2e7 square roots and multiply-adds) for the benchmarks to time beside their
 * figures: it does the same work every time, so when it is slow the machine was busy (on a shared VM
 * its time varies several-fold from minute to minute) and the figures measured with it are inflated
 * alike. About 40-50 ms on an idle 2-CPU Xeon VM with Node 20.
 */
export function machineCheckMs(): number {
  const t0 = performance.now();
  let s = 0;
  for (let i = 0; i < 2e7; i++) s += Math.sqrt(i) * 1.0000001;
  const t = performance.now() - t0;
  if (s < 0) console.log(s); // keeps the loop from being removed
  return t;
}
