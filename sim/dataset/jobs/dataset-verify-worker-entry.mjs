// Worker-thread bootstrap for the app's dataset verification: registers the TypeScript loader in
// this thread, then runs the verify worker. Plain JavaScript because a worker cannot load
// TypeScript before this runs.
import { register } from 'tsx/esm/api';

register();
await import('./dataset-verify-worker.ts');
