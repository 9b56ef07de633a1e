/** The README's library example runs as written and prints what its comments say. */
import { execFileSync } from 'node:child_process';
import { readFileSync, rmSync, writeFileSync } from 'node:fs';
import { expect, test } from 'vitest';

test('README library example prints the values in its comments (needs the build from `npm test`)', () => {
  const readme = readFileSync('README.md', 'utf8');
  const block = readme.split('## Library')[1].match(/```js\n([\s\S]*?)```/)![1];
  const expected = [...block.matchAll(/\/\/ (.+)$/gm)].map((m) => m[1]).filter((c) => !c.startsWith('invented'));
  const file = 'tests/.readme-example.tmp.mjs';
  writeFileSync(file, block);
  try {
    const out = execFileSync('node', [file], { encoding: 'utf8' }).trim().split('\n');
    expect(out).toEqual(expected);
  } finally {
    rmSync(file, { force: true });
  }
});
