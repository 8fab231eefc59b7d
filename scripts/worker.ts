// `npm run worker`: grades attempts in a process of its own (run the app with STOPWISE_INLINE_WORKER=0 beside it).
import { client } from '../src/lib/server/db/index';
import { closeQueue } from '../src/lib/server/attempts/queue';
import { startGradingWorker } from '../src/lib/server/attempts/worker';

const worker = await startGradingWorker();
console.log(`grading worker ${worker.id} ready`);

let stopping = false;
async function stop(signal: string): Promise<void> {
	if (stopping) return;
	stopping = true;
	console.log(`${signal}: finishing the current job, then stopping`);
	await worker.stop();
	await closeQueue();
	await client.end({ timeout: 5 });
	process.exit(0);
}
process.on('SIGINT', () => void stop('SIGINT'));
process.on('SIGTERM', () => void stop('SIGTERM'));
