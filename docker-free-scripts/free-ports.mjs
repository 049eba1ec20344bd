// Prints N free TCP ports on 127.0.0.1, one per line (plain Node, no dependencies, so it
// runs before `npm ci`). Each port is held open until all are found, so none repeats.
import { createServer } from 'node:net';

const count = Number(process.argv[2] ?? 1);
const servers = [];
for (let i = 0; i < count; i++) {
  const server = createServer();
  await new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(0, '127.0.0.1', resolve);
  });
  servers.push(server);
}
console.log(servers.map((s) => s.address().port).join('\n'));
await Promise.all(servers.map((s) => new Promise((r) => s.close(r))));
