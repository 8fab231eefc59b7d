// Where a clip's files live in the file store: `clips/<id>/<file>`; the files a clip may have are named here only.

export const RENDITION_HEIGHTS = [720, 360] as const;
export const POSTER_FILE = 'poster.jpg';
/** Every file name a clip's address may end in: the renditions, the poster, the captions (served from the row). */
export const CLIP_FILE = /^(720\.mp4|360\.mp4|poster\.jpg|captions\.vtt)$/;

const CLIP_ID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

export function isClipId(id: string): boolean {
	return CLIP_ID.test(id);
}

export function clipFolder(id: string): string {
	if (!isClipId(id)) throw new RangeError(`invalid clip id: ${JSON.stringify(id)}`);
	return `clips/${id}`;
}

export const clipKey = (id: string, file: string) => `${clipFolder(id)}/${file}`;

/** The address a page uses for one of a clip's files (answered by `/api/v1/clips/[id]/[file]` after the access check). */
export const clipUrl = (id: string, file: string) => `/api/v1/clips/${id}/${file}`;
