// Worker thread bootstrap: lets the worker load TypeScript (tsx), then starts parse-worker.ts.
import { register } from 'tsx/esm/api';

register();
await import('./parse-worker.ts');
