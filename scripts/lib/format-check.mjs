// The formatter's check as a test suite: every file Prettier formats counts as one check,
// passed when it is already formatted. The same rules as `npm run lint` (.prettierrc.json,
// .prettierignore), read through Prettier's own API so the count is exact.
import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';

/** Checks the project's tracked and new files; returns the counts and the unformatted paths. */
export async function checkFormatting(root) {
  // Imported here, not at the top: `npm test` loads this module before it installs packages.
  const prettier = await import('prettier');
  const listed = execFileSync('git', ['ls-files', '--cached', '--others', '--exclude-standard', '-z'], { cwd: root, encoding: 'utf8' });
  // A file deleted but not yet staged is still listed; it has nothing to check.
  const files = listed.split('\0').filter((file) => file && existsSync(path.join(root, file)));
  const ignorePath = path.join(root, '.prettierignore');
  const unformatted = [];
  let passed = 0;
  for (const file of files) {
    const filepath = path.join(root, file);
    const fileInfo = await prettier.getFileInfo(filepath, { ignorePath });
    if (fileInfo.ignored || !fileInfo.inferredParser) continue;
    const options = await prettier.resolveConfig(filepath);
    const formatted = await prettier.check(readFileSync(filepath, 'utf8'), { ...options, filepath });
    if (formatted) passed += 1;
    else unformatted.push(file);
  }
  return { passed, failed: unformatted.length, unformatted };
}
