// `npm start`: install if needed, build the client, then serve client and API from one process.
// The server itself runs the migrations and seeds the demo into an empty database.
import { bin, ensureClientBuilt, ensureInstalled, startChild } from './lib.mjs';

ensureInstalled();
ensureClientBuilt();
const server = startChild(bin('tsx'), ['--tsconfig', 'tsconfig.server.json', 'server/index.ts']);
server.on('exit', (code, signal) => process.exit(code ?? (signal ? 0 : 1)));
