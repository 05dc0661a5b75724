// Worker-thread bootstrap for the app's render jobs: registers the TypeScript loader in this
// thread, then runs the render job worker. Plain JavaScript because a worker cannot load
// TypeScript before this runs.
import { register } from 'tsx/esm/api';

register();
await import('./render-job-worker.ts');
