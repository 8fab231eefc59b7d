// npm run illustrations: renders every figure and diagram into static/illustrations/ and rewrites their catalogue.
// Deterministic: the same code gives the same files, so a re-render shows up in git only when a picture changed.
import { mkdir, writeFile } from 'node:fs/promises';
import { parseArgs } from 'node:util';
import { buildCatalogue } from '../src/lib/server/scenes/catalogue';
import { diagrams } from '../src/lib/server/scenes/diagrams/index';
import { toWebp } from '../src/lib/server/scenes/encode';
import { renderedFigures } from '../src/lib/server/scenes/figures';
import { renderFigure } from '../src/lib/server/scenes/picture';

const { values } = parseArgs({ options: { only: { type: 'string' } } });
const outDir = new URL('../static/illustrations/', import.meta.url);
await mkdir(outDir, { recursive: true });

for (const figure of renderedFigures) {
	if (values.only && figure.name !== values.only) continue;
	const started = performance.now();
	const webp = await toWebp(renderFigure(figure));
	await writeFile(new URL(`${figure.name}.webp`, outDir), webp);
	console.log(`${figure.name}.webp  ${(webp.length / 1024).toFixed(1)} KB  ${((performance.now() - started) / 1000).toFixed(1)} s`);
}
for (const diagram of diagrams) {
	if (values.only && diagram.name !== values.only) continue;
	const svg = diagram.svg();
	await writeFile(new URL(`${diagram.name}.svg`, outDir), svg);
	console.log(`${diagram.name}.svg  ${(svg.length / 1024).toFixed(1)} KB`);
}
const catalogue = buildCatalogue();
await writeFile(new URL('../src/lib/illustrations/catalogue.json', import.meta.url), JSON.stringify(catalogue, null, '\t') + '\n');
console.log(`catalogue: ${Object.keys(catalogue).length} illustrations`);
