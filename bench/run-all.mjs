// Runs every benchmark in bench/ in turn (after `npm run build`). Each prints its own results;
// copy them into bench/RESULTS.md with the date and the machine.
import { spawnSync } from 'node:child_process';
import { readdirSync } from 'node:fs';
import { join } from 'node:path';

const dir = import.meta.dirname;
for (const f of readdirSync(dir).filter((f) => f.endsWith('.mjs') && f !== 'run-all.mjs').sort()) {
  console.log(`\n## ${f}`);
  const r = spawnSync(process.execPath, [join(dir, f)], { stdio: 'inherit' });
  if (r.status !== 0) console.log(`(${f} exited ${r.status})`);
}
