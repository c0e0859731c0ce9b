import type { Server } from 'node:http';
import { createApp } from './app';
import { loadConfig } from './config';

/** Listens with the API and the built client on PORT; resolves once the port is bound. */
export function serve(): Promise<Server> {
  const config = loadConfig();
  const app = createApp();
  return new Promise((resolve, reject) => {
    const server = app.listen(config.port, config.host, () => {
      console.log(`Doublet is serving on http://${config.host}:${config.port}/`);
      resolve(server);
    });
    server.on('error', reject);
  });
}
