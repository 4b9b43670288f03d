/**
 * The parsing worker: runs the spreadsheet service's byte-level functions on a file the main
 * thread has read, inside a worker_threads Worker with a heap limit, and posts back their Result.
 * It imports no 'electron' and touches no file: bytes in, plain data out.
 *
 * Built on its own as dist/main/importWorker.mjs; under tests and tsx it runs from this source.
 */
import { parentPort } from 'node:worker_threads';
import { detectAndImportBytes, importWorkbookBytes, previewWorkbookBytes } from '../spreadsheet';
import type { JobReply, JobRequest } from './protocol';
import { watchPrototypes } from './prototypeWatch';
import { estimateReplyBytes } from './replySize';
import { declaredUnzippedBytes } from '../spreadsheet/zipCheck';

const port = parentPort;
if (port === null) throw new Error('importWorker must run as a worker thread');

const watch = watchPrototypes();

port.on('message', (message: JobRequest) => {
  const pollutionBefore = watch.changes();
  const reply = answer(message);
  // A job never starts on a polluted worker (the main thread discards it), so this only matters if
  // the main thread's own check were bypassed.
  port.postMessage(pollutionBefore.length > 0 ? { ...reply, pollution: [...pollutionBefore, ...reply.pollution] } : reply);
});

function answer(message: JobRequest): JobReply {
  const base = { type: 'reply', id: message.id } as const;
  try {
    spin(message.testOnly?.testOnlyBusyMillis);
    const declared = declaredUnzippedBytes(message.bytes);
    if (declared !== null && declared > message.maxReplyBytes) return { ...base, outcome: 'oversized', reason: 'declared', bytes: declared, pollution: watch.changes() };
    const result = run(message);
    const size = estimateReplyBytes(result, message.maxReplyBytes);
    if (size > message.maxReplyBytes) return { ...base, outcome: 'oversized', reason: 'reply', bytes: size, pollution: watch.changes() };
    return { ...base, outcome: 'done', result, pollution: watch.changes() };
  } catch (e) {
    const error = e instanceof Error ? `${e.name}: ${e.message}` : String(e);
    return { ...base, outcome: 'threw', error, pollution: watch.changes() };
  }
}

port.postMessage({ type: 'ready' });

function run(job: JobRequest): unknown {
  switch (job.kind) {
    case 'preview':
      return previewWorkbookBytes(job.bytes, job.fileName, job.override);
    case 'import':
      if (job.layout === undefined) throw new Error('import job without a layout');
      return importWorkbookBytes(job.bytes, job.fileName, job.layout);
    case 'detect':
      return detectAndImportBytes(job.bytes, job.fileName);
  }
}

/** Test hook: a synchronous busy loop the worker cannot leave except by being terminated. */
function spin(ms: number | undefined): void {
  if (ms === undefined || !(ms > 0)) return;
  const end = Date.now() + ms;
  while (Date.now() < end) {
    // busy on purpose
  }
}
