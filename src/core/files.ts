import { readFileSync, statSync, type Stats } from 'node:fs';
import { InputError } from './errors.js';

/** Check that `file` is an existing regular file, with located, actionable errors for the usual mistakes. */
export function requireFile(file: string, what: string): Stats {
  let st: Stats;
  try {
    st = statSync(file);
  } catch {
    throw new InputError(`the ${what} does not exist`, {
      where: { file },
      hint: `check the path (relative paths are taken from ${process.cwd()})`,
    });
  }
  if (st.isDirectory()) {
    throw new InputError(`a directory was given where a ${what} is expected`, {
      where: { file },
      hint: `name the file inside it`,
    });
  }
  return st;
}

/** Read a whole text file after `requireFile`'s checks. */
export function readTextFile(file: string, what: string): string {
  requireFile(file, what);
  return readFileSync(file, 'utf8');
}
