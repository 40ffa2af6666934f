// Keeps `prepare` out of the published package.json, and in the repository's (see DEVELOPERS.md,
// "Installing from git and from a tarball"). `prepare` must exist for a git dependency: npm installs
// the devDependencies of a git clone and builds dist/ only when the package has one. It must not be in
// a tarball: npm 11 warns in the user's project about every install script it sees there.
//   node scripts/pack-manifest.mjs prepack   back up package.json, write it without `prepare`, empty
//                                            dist/ and build it (restored at once if the build fails)
//   node scripts/pack-manifest.mjs postpack  put the backed-up package.json back
// The backup is written atomically before package.json is touched, so no state loses the original.
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

const ROOT = join(import.meta.dirname, '..');
const PKG = join(ROOT, 'package.json');
const BACKUP = join(ROOT, '.package.json.prepack');

function writeAtomic(file, text) {
  writeFileSync(`${file}.tmp`, text);
  renameSync(`${file}.tmp`, file);
}
function restore() {
  if (existsSync(BACKUP)) renameSync(BACKUP, PKG);
}

const step = process.argv[2];
if (step === 'prepack') {
  restore(); // a backup left by an interrupted pack is the original: put it back first
  const text = readFileSync(PKG, 'utf8');
  writeAtomic(BACKUP, text);
  const pkg = JSON.parse(text);
  delete pkg.scripts.prepare;
  writeAtomic(PKG, JSON.stringify(pkg, null, 2) + '\n');
  // STRAINLEDGER_PACK_PREBUILT=1: dist/ was just built by this checkout (the install test packs the tree
  // test/globalSetup.ts built, while other tests read it); keep it instead of emptying and rebuilding.
  if (process.env.STRAINLEDGER_PACK_PREBUILT === '1') process.exit(0);
  rmSync(join(ROOT, 'dist'), { recursive: true, force: true });
  const build = spawnSync('npm', ['run', 'build'], { cwd: ROOT, stdio: 'inherit' });
  if (build.status !== 0) {
    restore();
    process.exit(build.status ?? 1);
  }
} else if (step === 'postpack') {
  restore();
} else {
  process.stderr.write(`pack-manifest: got ${JSON.stringify(step)}, allowed prepack or postpack\n`);
  process.exit(2);
}
