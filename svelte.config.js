import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';
import { mdsvex } from 'mdsvex';
import { readdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const lessonLayout = fileURLToPath(new URL('./src/lib/components/LessonLayout.svelte', import.meta.url));
const widgetDir = fileURLToPath(new URL('./src/lib/components/widgets/', import.meta.url));
const widgetNames = readdirSync(widgetDir)
	.filter((f) => /^[A-Z]\w*\.svelte$/.test(f))
	.map((f) => f.replace('.svelte', ''));

/** Lessons use widget tags without imports: add an import for each registered widget a file uses. */
function importWidgets(code, filename) {
	const unknown = [...code.matchAll(/<([A-Z]\w*)/g)].map((m) => m[1]).find((tag) => !tag.endsWith('_MDSVEX_DEFAULT') && !widgetNames.includes(tag));
	if (unknown) throw new Error(`${filename}: <${unknown}> is not a lesson widget (known: ${widgetNames.join(', ')})`);
	const used = widgetNames.filter((name) => new RegExp(`<${name}[\\s/>]`).test(code));
	if (used.length === 0) return code;
	const imports = used.map((n) => `import ${n} from '$lib/components/widgets/${n}.svelte';`).join('\n');
	const instance = /<script(?![^>]*(?:module|context))[^>]*>/;
	return instance.test(code) ? code.replace(instance, (tag) => `${tag}\n${imports}`) : `<script>\n${imports}\n</script>\n${code}`;
}

/**
 * mdsvex emits Svelte 4 idioms (`{...$$props}` on its layout, `<script context="module">`)
 * that runes mode refuses; this runs after mdsvex and rewrites them.
 * @type {import('svelte/compiler').PreprocessorGroup}
 */
const mdsvexForRunes = {
	name: 'mdsvex-for-runes',
	markup({ content, filename }) {
		if (!filename?.endsWith('.svx')) return;
		const code = content
			.replace(/<script context="module">/g, '<script module>')
			.replace(/(<Layout_MDSVEX_DEFAULT[^>]*?)\s*\{\.\.\.\$\$props\}/g, '$1');
		return { code: importWidgets(code, filename) };
	}
};

/** @type {import('@sveltejs/kit').Config} */
const config = {
	extensions: ['.svelte', '.svx'],
	preprocess: [
		vitePreprocess(),
		mdsvex({ extensions: ['.svx'], smartypants: false, layout: { _: lessonLayout } }),
		mdsvexForRunes
	],
	vitePlugin: {
		// runes everywhere in our code (lessons included); packages keep their own mode
		dynamicCompileOptions: ({ filename }) => (filename.includes('node_modules') ? undefined : { runes: true })
	},
	kit: {
		adapter: adapter(),
		version: { name: process.env.npm_package_version ?? '0.1.0' }
	}
};

export default config;
