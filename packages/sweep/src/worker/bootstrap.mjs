// Worker-thread entry of the case pool. Worker threads do not inherit the TypeScript loader of
// the main thread, so this plain ES module registers tsx's loader first, then imports the
// TypeScript worker and hands its default export (the task function) to the pool.
import { register } from 'tsx/esm/api';

register();
const mod = await import('./caseWorker.ts');
export default mod.default;
