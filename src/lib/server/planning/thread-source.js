// Runs thread.ts from source in a planning thread where no built thread exists (vite dev, tests,
// benchmarks). Each thread registers tsx itself, so a thread started to replace a stopped one
// loads as the first did.
import { register } from 'tsx/esm/api';

register();
const { runTask } = await import(new URL('./thread.ts', import.meta.url).href);
export default runTask;
