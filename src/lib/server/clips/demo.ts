// The demo's clip, made by our own code at seed time: the scene model's invented trail runner as the daylight is dimmed
// stop by stop (f/11, f/16, f/22 at 1/250 s) and an off-camera strobe comes up, piped to ffmpeg frame by frame, then
// made into web renditions like any uploaded clip, with captions we wrote. Idempotent: a ready demo clip is left alone.
import { Readable } from 'node:stream';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { and, eq } from 'drizzle-orm';
import { randomUUID } from 'node:crypto';
import { srgbEncode } from '../../exposure/srgb';
import type { Db } from '../db/index';
import { courses, lessonClips, lessons, modules } from '../db/schema';
import { renderScene, type LinearFrame } from '../scenes/render';
import { meters, trailRunner } from '../scenes/scenes';
import type { Camera, Flash } from '../scenes/light';
import { fileStore } from '../storage/index';
import { runTool } from './ffmpeg';
import { clipFolder, clipKey } from './keys';
import { makeRenditions } from './renditions';

export const DEMO_CLIP = {
	course: 'daylight-flash-for-action',
	lesson: 'metering-and-going-under',
	name: 'dim-then-light',
	title: 'Dimming the daylight, then bringing the light back (rendered, invented runner)'
};

const WIDTH = 960;
const HEIGHT = 540;
const FPS = 12;
const SECONDS = 8;

/** Our captions: what the frames show, second by second (WebVTT). */
export const DEMO_CAPTIONS = `WEBVTT

00:00.000 --> 00:02.000
At the meter: f/11 at 1/250 s, ISO 100. The sky is pale and the runner's front is in shade.

00:02.000 --> 00:04.000
One stop under: f/16. The daylight dims and the sky deepens.

00:04.000 --> 00:05.500
Two stops under: f/22. A deep sky, and the runner goes dark.

00:05.500 --> 00:08.000
An off-camera strobe comes up to full power, high and to the left: the runner is lit again against the deep sky.

00:07.000 --> 00:08.000
Rendered by Stopwise's scene model: an invented runner, not footage.
`;

const smooth = (x: number) => (x <= 0 ? 0 : x >= 1 ? 1 : x * x * (3 - 2 * x));

/** Stops under the meter at time t (s): 0, then 1, then 2, each step eased over half a second. */
export function stopsUnderAt(t: number): number {
	return smooth((t - 2) / 0.5) + smooth((t - 4) / 0.5);
}

/** The strobe's power as a fraction of full at time t: off, then up from 1/64 to full in stops over 1.5 s. */
export function flashPowerAt(t: number): number {
	if (t < 5.5) return 0;
	return 2 ** (-6 * (1 - smooth((t - 5.5) / 1.5)));
}

// linear light to 8-bit sRGB through a table: finer steps than 8-bit sRGB's darkest code (IEC 61966-2-1)
const STEPS = 1 << 16;
const ENCODE = Uint8Array.from({ length: STEPS + 1 }, (_, i) => Math.round(srgbEncode(i / STEPS) * 255));

/** Every frame as 8-bit sRGB, one after another: daylight and strobe rendered once each, then mixed in linear light. */
function* frames(ambient: LinearFrame, flash: LinearFrame): Generator<Buffer> {
	const n = ambient.data.length;
	for (let i = 0; i < FPS * SECONDS; i++) {
		const t = i / FPS;
		// ambient rendered at f/11: each stop under halves it (APEX); the strobe rendered at f/22 at full power
		const a = 2 ** -stopsUnderAt(t);
		const f = flashPowerAt(t);
		const out = Buffer.allocUnsafe(n);
		for (let j = 0; j < n; j++) out[j] = ENCODE[Math.round(Math.min(1, Math.max(0, ambient.data[j] * a + flash.data[j] * f)) * STEPS)];
		yield out;
	}
}

async function renderSource(path: string): Promise<void> {
	const scene = trailRunner('light');
	const camera: Camera = { ...meters.brightSun, wbK: 5500 };
	const strobe: Flash = { at: [-1.4, 1.7, 2.2], aim: [0.3, 1.1, 3.6], gn: 64, power: 1 };
	const size = { width: WIDTH, height: HEIGHT, supersample: 1 };
	const ambient = renderScene(scene, camera, [], { ...size, only: 'ambient' });
	const flash = renderScene(scene, { ...camera, aperture: 22 }, [strobe], { ...size, only: 'flash' });
	const args = ['-hide_banner', '-y', '-f', 'rawvideo', '-pix_fmt', 'rgb24', '-s', `${WIDTH}x${HEIGHT}`, '-r', String(FPS), '-i', 'pipe:0'];
	args.push('-c:v', 'libx264', '-preset', 'ultrafast', '-crf', '16', '-pix_fmt', 'yuv420p', path);
	const run = await runTool('ffmpeg', args, { timeoutMs: 120_000, input: Readable.from(frames(ambient, flash)) });
	if (run.code !== 0) throw new Error(`ffmpeg could not encode the demo clip: ${run.stderr.slice(-400)}`);
}

/** Seeds the demo clip into its lesson; returns what it did. Without ffmpeg it says so and leaves the lesson without it. */
export async function seedDemoClip(db: Db): Promise<'made' | 'kept' | 'no-lesson' | 'no-ffmpeg'> {
	const [lesson] = await db
		.select({ id: lessons.id })
		.from(lessons)
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.where(and(eq(courses.slug, DEMO_CLIP.course), eq(lessons.slug, DEMO_CLIP.lesson)))
		.limit(1);
	if (!lesson) return 'no-lesson';
	const [existing] = await db.select().from(lessonClips).where(and(eq(lessonClips.lessonId, lesson.id), eq(lessonClips.name, DEMO_CLIP.name))).limit(1);
	if (existing?.status === 'ready' && existing.renditions.length > 0) {
		const stored = await Promise.all([...existing.renditions.map((r) => r.file), existing.poster ?? ''].map((f) => (f ? fileStore().openRange(clipKey(existing.id, f), 0, 0) : null)));
		const whole = stored.every((s) => s !== null);
		for (const s of stored) await s?.body.cancel();
		if (whole) return 'kept';
	}
	if (existing) {
		await db.delete(lessonClips).where(eq(lessonClips.id, existing.id));
		await fileStore().deletePrefix(clipFolder(existing.id));
	}
	const id = randomUUID();
	const work = await mkdtemp(join(tmpdir(), 'stopwise-demo-clip-'));
	try {
		const source = join(work, 'source.mp4');
		try {
			await renderSource(source);
		} catch (error) {
			if ((error as NodeJS.ErrnoException).code === 'ENOENT') return 'no-ffmpeg';
			throw error;
		}
		const done = await makeRenditions(id, source, () => undefined);
		await db.insert(lessonClips).values({ id, lessonId: lesson.id, name: DEMO_CLIP.name, title: DEMO_CLIP.title, captions: DEMO_CAPTIONS, status: 'ready', progress: 1, ...done });
		return 'made';
	} finally {
		await rm(work, { recursive: true, force: true });
	}
}
