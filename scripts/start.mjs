// `npm start`: the compiled server (dist/server/start.mjs), compiled first when it is missing or
// older than the sources. `npm run dev` runs the TypeScript sources instead.
import { runBuilt } from './build.mjs';

await runBuilt('start');
