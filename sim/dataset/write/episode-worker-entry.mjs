// Worker-thread bootstrap: registers the TypeScript loader in this thread, then runs the
// episode worker. Plain JavaScript because a worker cannot load TypeScript before this runs.
import { register } from 'tsx/esm/api';

register();
await import('./episode-worker.ts');
