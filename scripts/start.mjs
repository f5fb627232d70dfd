// `npm start`: install if needed, build the client, then serve client and API from one process.
// The server itself runs the migrations and seeds the demo into an empty database.
import { ensureClientBuilt, ensureInstalled, startChild } from './lib.mjs';

ensureInstalled();
ensureClientBuilt();
// node with tsx's loader rather than the tsx wrapper, so SIGINT/SIGTERM reach the server itself
// (the wrapper kills a child that is slow to answer) and it can shut down cleanly.
const server = startChild(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
  env: { ...process.env, TSX_TSCONFIG_PATH: 'tsconfig.server.json' },
});
server.on('exit', (code, signal) => process.exit(code ?? (signal ? 0 : 1)));
