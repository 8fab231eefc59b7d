// `npm run db:seed`: the invented demo scenario, idempotently, and the demo's rendered clip (made once, then kept).
import { client, db } from '../src/lib/server/db/index';
import { seedDemo } from '../src/lib/server/seed';
import { seedDemoClip } from '../src/lib/server/clips/demo';

try {
	await seedDemo(db);
	const clip = await seedDemoClip(db);
	if (clip === 'made') console.log('  demo clip rendered and encoded');
	if (clip === 'no-ffmpeg') console.log('  demo clip left out: ffmpeg is not installed');
} finally {
	await client.end();
}
