// Worker bootstrap of partitioned runs. Plain .mjs so that Node runs it without a loader: it
// registers tsx (core and plugins are TypeScript sources), then imports the worker module.
import { workerData } from 'node:worker_threads';
import { register } from 'tsx/esm/api';

register();
await import(workerData.entry);
