import { execFileSync } from 'node:child_process';

/** Debian's python3 with python3-pandas, when installed (CSV answers must stay readable by pd.read_csv); else undefined. */
export const PANDAS_PYTHON = ['/usr/bin/python3', 'python3'].find((python) => {
  try {
    execFileSync(python, ['-c', 'import pandas'], { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
});
