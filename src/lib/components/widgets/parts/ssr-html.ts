// Test support: reads text and attributes of elements in server-rendered widget HTML by their data-testid.

const VOID = new Set(['input', 'img', 'br', 'hr', 'meta', 'link', 'source', 'area', 'col', 'wbr']);

function decode(text: string): string {
	return text
		.replace(/&lt;/g, '<')
		.replace(/&gt;/g, '>')
		.replace(/&quot;/g, '"')
		.replace(/&#39;/g, "'")
		.replace(/&nbsp;/g, ' ')
		.replace(/&amp;/g, '&');
}

/** Plain text of an HTML fragment: comments dropped, tags turned to spaces, entities decoded, whitespace collapsed. */
export function plainText(html: string): string {
	return decode(html.replace(/<!--[\s\S]*?-->/g, '').replace(/<[^>]*>/g, ' ')).replace(/\s+/g, ' ').trim();
}

/** Every element carrying data-testid="testid", as its outer HTML, in document order. */
export function elementsByTestId(html: string, testid: string): string[] {
	const found: string[] = [];
	const marker = `data-testid="${testid}"`;
	for (let at = html.indexOf(marker); at >= 0; at = html.indexOf(marker, at + 1)) {
		const start = html.lastIndexOf('<', at);
		const name = /^<([a-zA-Z][\w-]*)/.exec(html.slice(start))?.[1].toLowerCase();
		if (!name) continue;
		const openEnd = html.indexOf('>', at) + 1;
		if (VOID.has(name) || html[openEnd - 2] === '/') {
			found.push(html.slice(start, openEnd));
			continue;
		}
		// Walk to the matching close tag, counting nested elements of the same name.
		const tags = new RegExp(`<(/?)${name}(?=[\\s>/])`, 'gi');
		tags.lastIndex = openEnd;
		let depth = 1;
		let end = html.length;
		for (let m = tags.exec(html); m; m = tags.exec(html)) {
			depth += m[1] ? -1 : 1;
			if (depth === 0) {
				end = html.indexOf('>', m.index) + 1;
				break;
			}
		}
		found.push(html.slice(start, end));
	}
	return found;
}

/** Text of the only element with this data-testid; throws (failing the test) when there is none or several. */
export function textOf(html: string, testid: string): string {
	const all = elementsByTestId(html, testid);
	if (all.length !== 1) throw new Error(`expected one element with data-testid="${testid}", found ${all.length}`);
	return plainText(all[0]);
}

/** An attribute of the only element with this data-testid (null when it lacks it). */
export function attrOf(html: string, testid: string, attr: string): string | null {
	const all = elementsByTestId(html, testid);
	if (all.length !== 1) throw new Error(`expected one element with data-testid="${testid}", found ${all.length}`);
	const open = all[0].slice(0, all[0].indexOf('>') + 1);
	const m = new RegExp(`\\s${attr}="([^"]*)"`).exec(open);
	return m ? decode(m[1]) : null;
}

/** Texts of the <li> items inside the only element with this data-testid. */
export function listItems(html: string, testid: string): string[] {
	const all = elementsByTestId(html, testid);
	if (all.length !== 1) throw new Error(`expected one element with data-testid="${testid}", found ${all.length}`);
	return [...all[0].matchAll(/<li[\s>][\s\S]*?<\/li>/g)].map((m) => plainText(m[0]));
}
