// Sanitises the HTML that authored Markdown compiles to: lesson prose only, no script, no handlers, no foreign URLs.
import sanitizeHtml from 'sanitize-html';

/** Lesson images are served by us, from uploads: `/lesson-images/<id>.webp`. Nothing else may be an image source. */
export const LESSON_IMAGE_PATH = /^\/lesson-images\/[a-f0-9]{20}\.webp$/;

const options: sanitizeHtml.IOptions = {
	allowedTags: [
		'h2', 'h3', 'h4', 'p', 'br', 'hr', 'blockquote', 'pre', 'code', 'kbd',
		'strong', 'em', 'b', 'i', 'del', 's', 'sup', 'sub',
		'ul', 'ol', 'li', 'a', 'img', 'table', 'thead', 'tbody', 'tr', 'th', 'td'
	],
	allowedAttributes: {
		a: ['href', 'title', 'rel'],
		img: ['src', 'alt', 'title', 'loading'],
		ol: ['start'],
		th: ['align'],
		td: ['align'],
		code: ['class']
	},
	allowedClasses: { code: [/^language-[A-Za-z0-9_+-]{1,30}$/] },
	allowedSchemes: ['http', 'https', 'mailto'],
	// images carry no scheme at all: only our own relative paths, checked again below
	allowedSchemesByTag: { img: [] },
	allowProtocolRelative: false,
	disallowedTagsMode: 'discard',
	// the content of these goes with the tag (the default list plus the other raw-text and embedding elements)
	nonTextTags: ['script', 'style', 'textarea', 'option', 'xmp', 'noscript', 'noembed', 'noframes', 'template', 'title', 'iframe', 'object', 'svg', 'math'],
	transformTags: {
		// the page's own title is the only h1; deeper levels than h4 read as h4
		h1: 'h2',
		h5: 'h4',
		h6: 'h4',
		a: (tagName, { rel: _authorsRel, ...attribs }) => {
			// links leaving the site do not pass our address or rank; the author's own rel is not trusted
			const external = /^(https?:|mailto:)/i.test(attribs.href ?? '');
			return { tagName, attribs: external ? { ...attribs, rel: 'noopener noreferrer nofollow' } : attribs };
		},
		img: (tagName, attribs) => ({ tagName, attribs: { ...attribs, loading: 'lazy' } })
	},
	exclusiveFilter: (frame) => frame.tag === 'img' && !LESSON_IMAGE_PATH.test(frame.attribs.src ?? ''),
	parseStyleAttributes: false
};

/** Authored HTML made safe to place with {@html}: only the allowed prose elements and attributes survive. */
export function sanitiseLessonHtml(html: string): string {
	return sanitizeHtml(html, options);
}
