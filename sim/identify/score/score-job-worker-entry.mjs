// Worker-thread bootstrap for the app's score jobs: registers the TypeScript loader in this
// thread, then runs the score job worker. Plain JavaScript because a worker cannot load
// TypeScript before this runs.
import { register } from 'tsx/esm/api';

register();
await import('./score-job-worker.ts');
