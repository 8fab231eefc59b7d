// The local-disk FileStore: round trips, whole-file writes, prefix deletes, and keys that cannot leave the root.
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createLocalDiskStore } from './local-disk';
import { checkKey } from './store';

let root: string;
beforeEach(async () => {
	root = await mkdtemp(join(tmpdir(), 'stopwise-store-'));
});
afterEach(async () => {
	await rm(root, { recursive: true, force: true });
});

describe('local disk store', () => {
	it('stores, reads back, deletes; a missing key reads as null', async () => {
		const store = createLocalDiskStore(root);
		await store.put('attempts/a1/0-original.jpg', Buffer.from('frame bytes'));
		expect((await store.get('attempts/a1/0-original.jpg'))?.toString()).toBe('frame bytes');
		await store.delete('attempts/a1/0-original.jpg');
		expect(await store.get('attempts/a1/0-original.jpg')).toBeNull();
		await store.delete('attempts/a1/0-original.jpg');
	});

	it('leaves no temporary files behind and overwrites whole', async () => {
		const store = createLocalDiskStore(root);
		await store.put('a/b.bin', Buffer.alloc(1000, 1));
		await store.put('a/b.bin', Buffer.from('short'));
		expect(await readdir(join(root, 'a'))).toEqual(['b.bin']);
		expect((await store.get('a/b.bin'))?.toString()).toBe('short');
	});

	it('deletes a whole folder by prefix, and a missing one quietly', async () => {
		const store = createLocalDiskStore(root);
		await store.put('attempts/x/0-large.webp', Buffer.from('1'));
		await store.put('attempts/x/1-large.webp', Buffer.from('2'));
		await store.put('attempts/y/0-large.webp', Buffer.from('3'));
		await store.deletePrefix('attempts/x');
		expect(await readdir(join(root, 'attempts'))).toEqual(['y']);
		await store.deletePrefix('attempts/never');
	});

	it('lists the folders under a prefix with when each was last written to; a missing prefix lists nothing', async () => {
		const store = createLocalDiskStore(root);
		await store.put('attempts/x/0-large.webp', Buffer.from('1'));
		await store.put('attempts/y/0-large.webp', Buffer.from('2'));
		await store.put('attempts/loose.bin', Buffer.from('3'));
		const listed = await store.listFolders('attempts');
		expect(listed.map((f) => f.name).sort()).toEqual(['x', 'y']);
		for (const f of listed) expect(Date.now() - f.modifiedAt.getTime()).toBeLessThan(60_000);
		expect(await store.listFolders('never')).toEqual([]);
	});

	it('refuses keys that could reach outside the root', () => {
		for (const bad of ['../etc/passwd', 'a/../../b', '/abs', 'a//b', '', 'a/.hidden', 'a\\b']) expect(() => checkKey(bad), bad).toThrow(RangeError);
		expect(checkKey('attempts/0b9f-1/0-original.jpg')).toEqual(['attempts', '0b9f-1', '0-original.jpg']);
	});
});
