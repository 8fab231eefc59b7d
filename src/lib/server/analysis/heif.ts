// Decodes HEIC/HEIF (ISO/IEC 23008-12) frames with libheif compiled to WebAssembly (npm libheif-js), in a worker thread.
import { createRequire } from 'node:module';
import { Worker } from 'node:worker_threads';
import { FrameReadError, malformed, tooManyPixels } from './errors';

export interface HeifPixels {
	/** 8-bit RGBA, row by row, upright (libheif applies the file's rotation and mirroring, ISO/IEC 23008-12 'irot'/'imir'). */
	data: Uint8Array;
	width: number;
	height: number;
	channels: 4;
}

type WorkerAnswer =
	| { id: number; ok: true; data: Uint8Array; width: number; height: number }
	| { id: number; ok: false; reason: 'unreadable' | 'too-many-pixels' | 'decode'; width?: number; height?: number; detail?: string };

// Decoding a 12 MP frame takes about a second of WebAssembly: in a thread of its own so requests keep being answered.
// The source is a string so it needs no file of its own beside the built app; libheif-js is found from here.
const WORKER_SOURCE = `
const { parentPort, workerData } = require('node:worker_threads');
console.log = () => {}; // libheif-js logs each failure; the answer carries it instead
const libheif = require(workerData.libheif);
parentPort.on('message', ({ id, bytes, maxPixels }) => {
	const decoder = new libheif.HeifDecoder();
	let handles = [];
	const done = (answer, transfer) => {
		for (const h of handles) h.free();
		try { if (decoder.decoder) libheif.heif_context_free(decoder.decoder); } catch {}
		parentPort.postMessage({ id, ...answer }, transfer ?? []);
	};
	try {
		handles = decoder.decode(bytes);
	} catch (e) {
		return done({ ok: false, reason: 'unreadable', detail: String(e) });
	}
	if (!handles.length) return done({ ok: false, reason: 'unreadable' });
	const image = handles.find((h) => h.is_primary()) ?? handles[0];
	const width = image.get_width();
	const height = image.get_height();
	if (!(width > 0 && height > 0)) return done({ ok: false, reason: 'unreadable' });
	if (width * height > maxPixels) return done({ ok: false, reason: 'too-many-pixels', width, height });
	const target = { data: new Uint8ClampedArray(width * height * 4), width, height };
	image.display(target, (shown) => {
		if (!shown) return done({ ok: false, reason: 'decode', width, height });
		const data = new Uint8Array(target.data.buffer);
		done({ ok: true, data, width, height }, [data.buffer]);
	});
});
`;

let worker: Worker | null = null;
let nextId = 1;
const pending = new Map<number, (answer: WorkerAnswer | Error) => void>();
// a decode that has not answered by then is stopped with its thread (a hostile file must not hold the decoder for good)
const DECODE_TIME_LIMIT_MS = 60_000;
// WebAssembly memory only grows: a thread idle this long is ended, which gives back what its largest frame took
const IDLE_MS = 30_000;
let idleTimer: NodeJS.Timeout | null = null;

function whenIdle(): void {
	if (pending.size > 0 || !worker) return;
	worker.unref();
	idleTimer = setTimeout(() => {
		const idle = worker;
		worker = null;
		void idle?.terminate();
	}, IDLE_MS);
	idleTimer.unref();
}

function theWorker(): Worker {
	if (worker) return worker;
	const libheif = createRequire(import.meta.url).resolve('libheif-js/wasm-bundle');
	const started = new Worker(WORKER_SOURCE, { eval: true, workerData: { libheif } });
	started.unref(); // an idle decoder never keeps the process alive
	started.on('message', (answer: WorkerAnswer) => {
		pending.get(answer.id)?.(answer);
		pending.delete(answer.id);
	});
	const fail = (error: Error) => {
		if (worker === started) worker = null;
		for (const settle of pending.values()) settle(error);
		pending.clear();
	};
	started.on('error', fail);
	started.on('exit', (code) => fail(new Error(`the HEIF decoder stopped (exit ${code})`)));
	worker = started;
	return started;
}

/** Decodes the primary image; rejects only with FrameReadError (damaged, too many pixels, or a variant libheif cannot decode). */
export async function decodeHeif(bytes: Uint8Array, maxPixels: number): Promise<HeifPixels> {
	const id = nextId++;
	if (idleTimer) clearTimeout(idleTimer);
	idleTimer = null;
	let timer: NodeJS.Timeout | undefined;
	const answer = await new Promise<WorkerAnswer | Error>((resolve) => {
		pending.set(id, resolve);
		const w = theWorker();
		w.ref(); // kept alive while a decode is pending
		w.postMessage({ id, bytes: new Uint8Array(bytes), maxPixels });
		// decodes run one after another, so the limit counts those queued ahead; ending the thread answers every
		// pending decode with an error (the 'exit' handler), this one included
		timer = setTimeout(() => void w.terminate(), DECODE_TIME_LIMIT_MS * pending.size);
	}).finally(() => {
		clearTimeout(timer);
		whenIdle();
	});
	if (answer instanceof Error) throw malformed(answer, 'HEIC');
	if (answer.ok) return { data: answer.data, width: answer.width, height: answer.height, channels: 4 };
	if (answer.reason === 'too-many-pixels') throw tooManyPixels(answer.width ?? null, answer.height ?? null, maxPixels);
	if (answer.reason === 'unreadable') throw malformed(new Error(answer.detail ?? 'libheif could not parse the file'), 'HEIC');
	throw new FrameReadError(
		'not-decodable',
		'This HEIC file could not be decoded here: it is damaged, or its image is coded in a way this server cannot read. Export it again from the phone, or upload a JPEG of the same frame.'
	);
}
