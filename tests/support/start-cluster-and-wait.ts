// Stands in for `npm start` in the takeover test: starts the cluster, says so, then waits to be
// killed with SIGKILL (so it never stops the cluster). Usage: start-cluster-and-wait.ts DIR PORT
import { startCluster } from '../../scripts/lib/postgres-cluster';

const [dataFolder, port] = process.argv.slice(2);
await startCluster({ dataFolder: dataFolder!, port: Number(port), disposable: true });
process.stdout.write('started\n');
setInterval(() => undefined, 60_000);
