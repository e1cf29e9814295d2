/**
 * The functions a V8 CPU profile (`.cpuprofile`, e.g. from `npm run load` with LOAD_PROFILE_DIR) spent most time
 * in, by self time and by total time (inclusive of callees, each function counted once per sample).
 *   node --import tsx tests/bench/cpu-profile-top.ts <file.cpuprofile> [how many, default 40]
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';

interface ProfileNode {
  id: number;
  callFrame: { functionName: string; url: string; lineNumber: number };
  children?: number[];
}
interface Profile {
  nodes: ProfileNode[];
  samples: number[];
  timeDeltas: number[];
}

const [file, howMany = '40'] = process.argv.slice(2);
if (!file) throw new Error('usage: cpu-profile-top.ts <file.cpuprofile> [how many]');
const profile = JSON.parse(readFileSync(file, 'utf8')) as Profile;
const byId = new Map(profile.nodes.map((n) => [n.id, n]));
const parent = new Map<number, number>();
for (const n of profile.nodes) for (const c of n.children ?? []) parent.set(c, n.id);
const label = (n: ProfileNode) =>
  `${n.callFrame.functionName || '(anonymous)'} ${n.callFrame.url ? `${path.basename(n.callFrame.url)}:${n.callFrame.lineNumber + 1}` : ''}`.trim();

const self = new Map<string, number>();
const total = new Map<string, number>();
let all = 0;
profile.samples.forEach((id, k) => {
  const us = profile.timeDeltas[k + 1] ?? 0;
  all += us;
  const node = byId.get(id)!;
  self.set(label(node), (self.get(label(node)) ?? 0) + us);
  const seen = new Set<string>();
  for (let at: number | undefined = id; at !== undefined; at = parent.get(at)) {
    const name = label(byId.get(at)!);
    if (seen.has(name)) continue;
    seen.add(name);
    total.set(name, (total.get(name) ?? 0) + us);
  }
});
const idle = self.get('(idle)') ?? 0;
console.log(`${(all / 1000).toFixed(0)} ms sampled, ${((all - idle) / 1000).toFixed(0)} ms not idle`);
for (const [title, table] of [
  ['self', self],
  ['total', total],
] as const) {
  console.log(`\nby ${title} time (% of not idle):`);
  for (const [name, us] of [...table]
    .filter(([n]) => n !== '(idle)' && n !== '(root)')
    .sort((a, b) => b[1] - a[1])
    .slice(0, Number(howMany)))
    console.log(`  ${((us / (all - idle)) * 100).toFixed(1).padStart(5)} %  ${(us / 1000).toFixed(0).padStart(6)} ms  ${name}`);
}
