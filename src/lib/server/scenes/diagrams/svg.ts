// A few helpers for drawing our diagrams as standalone SVG files in the site's colours.

/** The site's palette (tailwind.config.ts): amber is flash, cobalt is ambient, everywhere. */
export const colours = {
	page: '#212328',
	line: '#4a4f5a',
	ink: '#e6e4df',
	muted: '#a9a8a3',
	flash: '#f0a040',
	flashSoft: '#f6c27f',
	ambient: '#3d74e0',
	ambientSoft: '#8fb0f0',
	midgrey: '#767676'
} as const;

/** A drawn diagram: a file name (without extension), its size, and how to draw it. */
export interface Diagram {
	name: string;
	width: number;
	height: number;
	svg(): string;
}

export function escapeXml(text: string): string {
	return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/** A standalone SVG document; its title is what screen readers hear if the file is opened on its own. */
export function svgDocument(width: number, height: number, title: string, body: string): string {
	return (
		`<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${width} ${height}" width="${width}" height="${height}" role="img">` +
		`<title>${escapeXml(title)}</title>` +
		`<rect width="${width}" height="${height}" rx="10" fill="${colours.page}"/>` +
		`<g font-family="Inter, system-ui, sans-serif" font-size="15" fill="${colours.ink}">${body}</g></svg>\n`
	);
}

/** Text at (x, y); `anchor` start, middle or end; numbers in a monospace face when `mono`. */
export function text(x: number, y: number, content: string, opts: { anchor?: 'start' | 'middle' | 'end'; fill?: string; size?: number; mono?: boolean; weight?: number } = {}): string {
	const attrs = [
		`x="${round(x)}"`, `y="${round(y)}"`,
		opts.anchor && opts.anchor !== 'start' ? `text-anchor="${opts.anchor}"` : '',
		opts.fill ? `fill="${opts.fill}"` : '',
		opts.size ? `font-size="${opts.size}"` : '',
		opts.mono ? `font-family="JetBrains Mono, ui-monospace, monospace"` : '',
		opts.weight ? `font-weight="${opts.weight}"` : ''
	].filter(Boolean).join(' ');
	return `<text ${attrs}>${escapeXml(content)}</text>`;
}

export function line(x1: number, y1: number, x2: number, y2: number, stroke: string, width = 2, dash = ''): string {
	return `<line x1="${round(x1)}" y1="${round(y1)}" x2="${round(x2)}" y2="${round(y2)}" stroke="${stroke}" stroke-width="${width}"${dash ? ` stroke-dasharray="${dash}"` : ''} stroke-linecap="round"/>`;
}

/** Rounds to two decimals so files stay small and identical run to run. */
export function round(v: number): number {
	return Math.round(v * 100) / 100;
}
