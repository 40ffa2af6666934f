import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';
import { globSync } from 'tinyglobby';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { extractBlocks, ROOT, runShBlock, runTsBlock, shCommands, typecheckTsBlocks } from './docExamples.js';

// Every command and code example of the README and docs/ runs here (STYLE.md: documented examples
// are tests). A broken example fails with its file and line.
const pages = ['README.md', ...globSync('docs/**/*.md', { cwd: ROOT }).sort()];
// The working tree's status, or null outside a git checkout (an unpacked tarball): then not compared.
const untracked = (): string | null => {
  try {
    return execFileSync('git', ['status', '--porcelain', '--untracked-files=all'], { cwd: ROOT, encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'] });
  } catch {
    return null;
  }
};

describe('documented examples run as written', () => {
  let before: string | null = null;
  beforeAll(() => { before = untracked(); });
  // Examples write only into temp folders: the working tree is as it was.
  afterAll(() => { if (before !== null) expect(untracked()).toBe(before); });

  for (const page of pages) {
    const blocks = extractBlocks(readFileSync(join(ROOT, page), 'utf8'), page);
    for (const b of blocks) {
      it(`${page}:${b.line} (${b.lang})`, () => {
        const r = b.lang === 'sh' ? runShBlock(b) : runTsBlock(b);
        if (!r.ok) throw new Error(r.message);
      });
    }
  }

  it('every ts block type-checks as a strict TypeScript user of the package would compile it', () => {
    const ts = pages.flatMap((p) => extractBlocks(readFileSync(join(ROOT, p), 'utf8'), p)).filter((b) => b.lang === 'ts');
    expect(typecheckTsBlocks(ts)).toEqual([]);
  });

  it('finds the examples of the front door and of each reference page', () => {
    const count = (p: string) => extractBlocks(readFileSync(join(ROOT, p), 'utf8'), p).length;
    expect(count('README.md')).toBeGreaterThanOrEqual(2); // runner and library faces
    for (const p of ['docs/runner.md', 'docs/records-and-fits.md', 'docs/reversal-and-springback.md', 'docs/process-planning.md', 'docs/scatter.md', 'docs/library.md']) {
      expect(count(p), p).toBeGreaterThanOrEqual(1);
    }
  });
});

describe('README.md is the front door', () => {
  const readme = readFileSync(join(ROOT, 'README.md'), 'utf8');
  it('starts with one paragraph stating the job, then the cautions', () => {
    const [title, job, caution] = readme.split(/\n\s*\n/);
    expect(title).toBe('# strainledger');
    expect(job).toMatch(/^Process engineers who cold-form metal/);
    expect(caution).toMatch(/^> \*\*Caution\.\*\*[\s\S]*codes, standards and licensed engineering practice/);
  });
  it('links every reference page (issue 13 and the pages other helpers add)', () => {
    for (const p of ['plan-file', 'runner', 'records-and-fits', 'reversal-and-springback', 'process-planning', 'scatter', 'library', 'bases-and-units', 'hardness', 'tempers-and-anneals']) {
      expect(readme).toContain(`](docs/${p}.md)`);
    }
  });
  it('stays short: the reference lives in docs/', () => {
    expect(Buffer.byteLength(readme)).toBeLessThan(10_000);
  });
});

// Pages other helpers add at the same time (issue 13 brief); a link to them is fine until the lead merges.
const PAGES_COMING = new Set(['docs/bases-and-units.md', 'docs/hardness.md', 'docs/tempers-and-anneals.md']);

/** GitHub's heading anchor: lower case, punctuation dropped (letters, digits, `-`, `_` and spaces kept), spaces → `-`. */
function anchorOf(heading: string): string {
  return heading.trim().toLowerCase().replace(/[^\p{L}\p{N}\s_-]/gu, '').replace(/\s/g, '-');
}

describe('links between the pages resolve', () => {
  it('anchorOf follows GitHub\'s rule (worked by hand)', () => {
    expect(anchorOf('Sharding a CI matrix (`--shard` and `merge`)')).toBe('sharding-a-ci-matrix---shard-and-merge');
    expect(anchorOf('The JSON report (version 1)')).toBe('the-json-report-version-1');
  });
  for (const page of pages) {
    it(`${page}: every relative link names a file (and heading) that exists`, () => {
      const text = readFileSync(join(ROOT, page), 'utf8').replace(/```[\s\S]*?```/g, '');
      const bad: string[] = [];
      let checked = 0;
      for (const m of text.matchAll(/\]\(([^)\s]+)\)/g)) {
        const target = m[1]!;
        if (/^[a-z]+:/i.test(target)) continue; // http:, https:, mailto:
        const [path, anchor] = target.split('#') as [string, string | undefined];
        const file = path === '' ? page : join(page, '..', path).replace(/\\/g, '/');
        if (PAGES_COMING.has(file)) continue;
        checked++;
        let body: string;
        try {
          body = readFileSync(join(ROOT, file), 'utf8');
        } catch {
          bad.push(`${target} (no file ${file})`);
          continue;
        }
        if (anchor !== undefined && file.endsWith('.md')) {
          const anchors = [...body.replace(/```[\s\S]*?```/g, '').matchAll(/^#{1,6} (.*)$/gm)].map((h) => anchorOf(h[1]!));
          if (!anchors.includes(anchor)) bad.push(`${target} (no heading #${anchor} in ${file})`);
        }
      }
      expect(bad).toEqual([]);
      if (page === 'README.md') expect(checked).toBeGreaterThanOrEqual(10); // the front door's links were all seen
    });
  }
});

describe('the docs test itself catches a broken example (file and line)', () => {
  const dir = mkdtempSync(join(tmpdir(), 'sl-docs-self-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  const page = join(dir, 'broken.md');
  writeFileSync(page, [
    '# A page', '', '```sh', 'strainledger run examples/contact-spring-strip.json', 'strainledger run examples/bracket-stretch-specimen.yaml', '```', '',
    '```sh no-run', 'exit 5', '```', '',
    '```sh', 'strainledger run examples/bracket-stretch-specimen.yaml   # exit 1', 'x=$(mktemp -d)', 'test -d "$x"', '```', '',
    '```ts', "import { hollomon } from 'strainledger';", 'const law = hollomon({ K: 530, n: 0.44 });', "if (!(law.stress(0.1) > 0)) throw new Error('no stress');", "throw new Error('deliberately broken');", '```', '',
    '```ts', "import { loadPlanText } from 'strainledger/plan';", "if (typeof loadPlanText !== 'function') throw new Error('missing');", '```',
  ].join('\n'));
  const blocks = extractBlocks(readFileSync(page, 'utf8'), page);
  it('reads the convention: sh, sh no-run skipped, # exit N, ts', () => {
    expect(blocks.map((b) => [b.lang, b.line])).toEqual([['sh', 3], ['sh', 12], ['ts', 18], ['ts', 25]]);
    expect(shCommands(blocks[1]!).map((c) => [c.line, c.exit])).toEqual([[13, 1], [14, 0], [15, 0]]);
  });
  it('a command that exits otherwise than stated fails at its line', () => {
    const r = runShBlock(blocks[0]!);
    expect(r.ok).toBe(false);
    expect(r.message).toMatch(new RegExp(`${relative('/', page).replace(/[.]/g, '\\.')}:5: exit 1, expected 0`));
  });
  it('a block whose exits are as stated passes (variables carry across lines)', () => {
    expect(runShBlock(blocks[1]!)).toEqual({ ok: true, message: '' });
  });
  it('a ts block that throws fails with its file and line; one that runs passes', () => {
    const bad = runTsBlock(blocks[2]!);
    expect(bad.ok).toBe(false);
    expect(bad.message).toContain(`${page}:18:`);
    expect(bad.message).toContain('deliberately broken');
    expect(runTsBlock(blocks[3]!).ok).toBe(true);
  });
  it('a ts block with a type error is reported at its Markdown line', () => {
    const bad = { file: page, line: 40, lang: 'ts' as const, body: "import { hollomon } from 'strainledger';\nhollomon({ K: 'x', n: 0.2 });" };
    const errs = typecheckTsBlocks([blocks[3]!, bad]);
    expect(errs).toHaveLength(1);
    expect(errs[0]).toMatch(new RegExp(`broken\\.md:42:\\d+: error TS2322`));
  });
});
