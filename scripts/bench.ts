// `npm run bench`: runs each registered benchmark in turn; add a module under scripts/bench/ and list it below.
import { gradingBench } from './bench/grading';
import { cameraFormatsBench } from './bench/camera-formats';
import { reviewQueueBench } from './bench/review-queue';
import { uploadToVerdictBench } from './bench/upload-to-verdict';
import { healthUnderGradingBench } from './bench/health-under-grading';
import { signInTimingBench } from './bench/sign-in-timing';
import { signUpTimingBench } from './bench/sign-up-timing';
import { pageLoadBench } from './bench/page-load';
import { uploadMemoryBench } from './bench/upload-memory';
import type { Bench } from './bench/timing';

const BENCHES: Bench[] = [gradingBench, cameraFormatsBench, reviewQueueBench, uploadToVerdictBench, healthUnderGradingBench, signInTimingBench, signUpTimingBench, pageLoadBench, uploadMemoryBench];

async function main(): Promise<number> {
	// `npm run bench -- grading` (or `npx tsx scripts/bench.ts grading`) runs only the benchmarks whose name holds the word
	const only = process.argv[2]?.toLowerCase();
	const chosen = only ? BENCHES.filter((b) => b.name.toLowerCase().includes(only)) : BENCHES;
	let missed = 0;
	for (const bench of chosen) {
		console.log(`\n■ ${bench.name}`);
		try {
			const report = await bench.run();
			for (const line of report.lines) console.log(`  ${line}`);
			if (!report.ok) missed++;
		} catch (error) {
			missed++;
			console.error(`  failed: ${error instanceof Error ? error.message : String(error)}`);
		}
	}
	console.log(missed ? `\n${missed} of ${chosen.length} benchmarks missed their target.` : `\nAll ${chosen.length} benchmarks met their targets.`);
	return missed ? 1 : 0;
}

main().then((code) => process.exit(code));
