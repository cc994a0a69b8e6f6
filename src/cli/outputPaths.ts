/**
 * Report files are written safely: every output path is checked before the
 * check runs (its folder exists and takes files, it is not an input, it does
 * not exist unless `--force`), and each file is written to a temporary name
 * in the same folder, then renamed into place, so that a failure never leaves
 * a half-written report (or a damaged earlier one) behind.
 */
import * as fs from 'fs';
import * as path from 'path';
import { CutlineError } from '../engine';

function real(p: string): string {
  try {
    return fs.realpathSync(p);
  } catch {
    return path.resolve(p);
  }
}

/** Refuses an output path that cannot or must not be written; `option` names it in the message. */
export function checkOutputPath(option: string, out: string, inputs: string[], force: boolean): void {
  const abs = path.resolve(out);
  const dir = path.dirname(abs);
  let st: fs.Stats;
  try {
    st = fs.statSync(dir);
  } catch {
    throw new CutlineError(`${option}: the folder ${dir} does not exist (create it first)`);
  }
  if (!st.isDirectory()) throw new CutlineError(`${option}: ${dir} is not a folder`);
  const target = real(abs);
  for (const input of inputs) {
    if (real(input) === target) throw new CutlineError(`${option}: ${out} is an input file; Cutline never overwrites its input, give another name`);
  }
  if (fs.existsSync(abs)) {
    if (fs.statSync(abs).isDirectory()) throw new CutlineError(`${option}: ${out} is a folder; give a file name`);
    if (!force) throw new CutlineError(`${option}: ${out} already exists; give --force to replace it`);
  }
  try {
    fs.accessSync(dir, fs.constants.W_OK);
  } catch {
    throw new CutlineError(`${option}: cannot write in the folder ${dir} (permission denied)`);
  }
}

/** Writes bytes to a temporary file beside `out`, then renames it to `out`; nothing is left on failure. */
export function writeAtomic(option: string, out: string, bytes: Uint8Array | string): void {
  const abs = path.resolve(out);
  const tmp = path.join(path.dirname(abs), `.${path.basename(abs)}.${process.pid}.${Math.random().toString(36).slice(2)}.tmp`);
  try {
    fs.writeFileSync(tmp, bytes, { flag: 'wx' });
    fs.renameSync(tmp, abs);
  } catch (e) {
    try {
      fs.unlinkSync(tmp);
    } catch {
      /* nothing was written */
    }
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'EACCES' || code === 'EPERM' ? 'permission denied' : code === 'EROFS' ? 'read-only file system' : code === 'ENOSPC' ? 'disk full' : (code ?? String(e));
    throw new CutlineError(`${option}: cannot write ${out} (${why}); nothing was written`);
  }
}
