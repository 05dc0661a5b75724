// Worker-thread bootstrap for the app's dataset jobs: registers the TypeScript loader in this
// thread, then runs the job worker. Plain JavaScript because a worker cannot load TypeScript
// before this runs.
import { register } from 'tsx/esm/api';

register();
await import('./dataset-job-worker.ts');
