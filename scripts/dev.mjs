// `npm run dev`: Vite with hot reload on VITE_PORT (5173), the API on API_PORT (3001) restarting
// on change; Vite proxies /api to it.
import { bin, ensureInstalled, log, startChild } from './lib.mjs';

ensureInstalled();
const apiPort = process.env.API_PORT ?? '3001';
const vitePort = process.env.VITE_PORT ?? '5173';
const env = { ...process.env, PORT: apiPort, PUBLIC_URL: process.env.PUBLIC_URL ?? `http://localhost:${vitePort}` };
const api = startChild(bin('tsx'), ['watch', '--clear-screen=false', '--tsconfig', 'tsconfig.server.json', 'server/index.ts'], { env });
const vite = startChild(bin('vite'), ['--port', vitePort, '--strictPort'], { env });
log(`open http://localhost:${vitePort}/ (API on ${apiPort})`);
for (const child of [api, vite]) child.on('exit', (code) => process.exit(code ?? 0));
