/** Worker-thread entry (bundled to dist/analysisWorker.js): runs analyses posted by `WorkerAnalyser`. */
import { parentPort } from 'node:worker_threads';
import { runJob } from '../analyser';
import type { JobRequest } from '../analyser';

const port = parentPort;
if (!port) throw new Error('analysisWorker.js runs only as a worker thread');
port.on('message', (request: JobRequest) => runJob(request, (reply) => port.postMessage(reply)));
