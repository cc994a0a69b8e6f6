/**
 * A batch worker thread: checks the files it is handed one at a time and
 * writes their reports, replying with the headline numbers or the error
 * (the same one-line message the single-file command prints).
 */
import { parentPort } from 'worker_threads';
import { CutlineError } from '../engine';
import { WorkerReply, WorkerTask } from './batch';
import { checkFile } from './checkFile';
import { errorLine } from './errorLine';
import { writeReports } from './reportFiles';

export function startBatchWorker(): void {
  parentPort!.on('message', async (t: WorkerTask) => {
    let reply: WorkerReply;
    try {
      const c = await checkFile(t.file, t.spec, true);
      const model = await writeReports(c.source!, c.result, t.spec.options, c.names, t.req);
      reply = { ok: true, headline: model.headline };
    } catch (e) {
      const msg = e instanceof CutlineError ? errorLine(e) : `internal error: ${e instanceof Error ? e.message : String(e)}`;
      reply = { ok: false, error: msg };
    }
    parentPort!.postMessage(reply);
  });
}
