// `npm run eval`: renders the evaluation set, grades every pair and prints each criterion's accuracy against the truth.
import { makeCases } from '../src/lib/server/evaluation/cases';
import { formatScores, runCase, score } from '../src/lib/server/evaluation/score';

const count = Number(process.argv[2] ?? 150);
// a second seed gives a set the thresholds were not chosen on
const seed = process.argv[3] === undefined ? undefined : Number(process.argv[3]);
const started = performance.now();
const outcomes = [];
for (const c of makeCases(count, seed)) outcomes.push(await runCase(c));
const scores = score(outcomes);
console.log(`Evaluation set: ${count} pairs${seed === undefined ? '' : ` from seed ${seed}`} (768×512, three tone curves, JPEG q80–95), graded in ${((performance.now() - started) / 1000).toFixed(1)} s`);
console.log('Goals: median error ≤ 0.15 stop, p95 ≤ 0.35, no false passes, false fails ≤ 5 % of the set.');
console.log('Errors are over stated numbers; "bounds" are results given only as a bound or a range (not in the errors), "missed" those the truth lies outside.\n');
for (const line of formatScores(scores)) console.log(`  ${line}`);
const wrong = scores.flatMap((s) => s.wrong.map((w) => `${s.kind}: ${w}`));
if (wrong.length) console.log(`\nWrong verdicts:\n  ${wrong.join('\n  ')}`);
