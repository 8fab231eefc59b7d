// Debian's ffprobe and ffmpeg in child processes: what a file holds, and the web renditions with progress (-progress).
import { spawn } from 'node:child_process';

export interface Probe {
	durationSeconds: number;
	width: number;
	height: number;
	hasAudio: boolean;
}

export class MediaError extends Error {
	constructor(
		message: string,
		/** the author's words */
		readonly authorMessage: string
	) {
		super(message);
	}
}

const UNREADABLE = 'This file could not be read as video. Export it again as MP4 (H.264), MOV or WebM and upload that.';

interface Run {
	code: number | null;
	stdout: string;
	stderr: string;
}

/** Runs a tool to its end, killing it after `timeoutMs`; stdout lines go to `onLine` as they come. */
export function runTool(command: string, args: string[], options: { timeoutMs: number; onLine?: (line: string) => void; input?: NodeJS.ReadableStream }): Promise<Run> {
	return new Promise((resolve, reject) => {
		const child = spawn(command, args, { stdio: [options.input ? 'pipe' : 'ignore', 'pipe', 'pipe'] });
		let stdout = '';
		let stderr = '';
		let pending = '';
		const timer = setTimeout(() => child.kill('SIGKILL'), options.timeoutMs);
		child.stdout!.setEncoding('utf8').on('data', (chunk: string) => {
			if (stdout.length < 1_000_000) stdout += chunk;
			if (!options.onLine) return;
			pending += chunk;
			const lines = pending.split('\n');
			pending = lines.pop() ?? '';
			for (const line of lines) options.onLine(line);
		});
		// keep the end of stderr only: its last lines say why ffmpeg stopped
		child.stderr!.setEncoding('utf8').on('data', (chunk: string) => (stderr = (stderr + chunk).slice(-8000)));
		if (options.input && child.stdin) {
			child.stdin.on('error', () => undefined);
			options.input.pipe(child.stdin);
		}
		child.on('error', (error) => {
			clearTimeout(timer);
			reject(error);
		});
		child.on('close', (code) => {
			clearTimeout(timer);
			resolve({ code, stdout, stderr });
		});
	});
}

function missingTool(error: unknown): never {
	if ((error as NodeJS.ErrnoException).code === 'ENOENT') {
		throw new MediaError('ffmpeg is not installed', 'Video cannot be processed on this server yet (ffmpeg is missing). Ask the administrator to run the bootstrap.');
	}
	throw error;
}

/** What ffprobe finds in a file: its length, picture size (as shown, after rotation) and whether it has sound. */
export async function probe(path: string): Promise<Probe> {
	const run = await runTool('ffprobe', ['-v', 'error', '-print_format', 'json', '-show_format', '-show_streams', path], { timeoutMs: 60_000 }).catch(missingTool);
	if (run.code !== 0) throw new MediaError(`ffprobe failed: ${run.stderr.trim().split('\n').at(-1) ?? ''}`, UNREADABLE);
	type Stream = { codec_type?: string; width?: number; height?: number; duration?: string; side_data_list?: { rotation?: number }[]; tags?: { rotate?: string } };
	let parsed: { streams?: Stream[]; format?: { duration?: string } };
	try {
		parsed = JSON.parse(run.stdout);
	} catch {
		throw new MediaError('ffprobe printed no JSON', UNREADABLE);
	}
	const video = parsed.streams?.find((s) => s.codec_type === 'video' && (s.width ?? 0) > 0);
	if (!video) throw new MediaError('no video stream', 'This file has no pictures in it (no video stream). Upload a video file.');
	const duration = Number(parsed.format?.duration ?? video.duration);
	if (!Number.isFinite(duration) || duration <= 0) throw new MediaError('no duration', UNREADABLE);
	const rotation = Math.abs(Number(video.side_data_list?.find((d) => d.rotation !== undefined)?.rotation ?? video.tags?.rotate ?? 0)) % 180;
	const [width, height] = rotation === 90 ? [video.height!, video.width!] : [video.width!, video.height!];
	return { durationSeconds: duration, width, height, hasAudio: parsed.streams?.some((s) => s.codec_type === 'audio') ?? false };
}

/** The share of the work done, from one line of ffmpeg's `-progress` output (`out_time_us=…`); null for other lines. */
export function progressOf(line: string, durationSeconds: number): number | null {
	const m = /^out_time_(?:us|ms)=(\d+)$/.exec(line.trim());
	if (!m || durationSeconds <= 0) return null;
	// ffmpeg writes microseconds under both names (out_time_ms is a misnomer kept for compatibility)
	return Math.min(1, Math.max(0, Number(m[1]) / 1e6 / durationSeconds));
}

/** An even number of pixels (H.264 in 4:2:0 needs even sides) no larger than the source's. */
const evenHeight = (target: number) => `trunc(min(${target}\\,ih)/2)*2`;

export interface RenditionOutput {
	height: number;
	path: string;
}

/**
 * Both web renditions in one ffmpeg run (the source decoded once): H.264 main profile, yuv420p, AAC stereo, the index at
 * the front (`+faststart`) so playback starts before the whole file arrives. A source without sound gets a silent track,
 * so every rendition plays alike.
 */
export async function transcode(source: string, outputs: RenditionOutput[], info: Probe, onProgress: (fraction: number) => void): Promise<void> {
	const split = outputs.map((_, i) => `[v${i}]`).join('');
	const scales = outputs.map((o, i) => `[v${i}]scale=-2:'${evenHeight(o.height)}',setsar=1[o${i}]`).join(';');
	const args = ['-hide_banner', '-nostdin', '-y', '-i', source];
	if (!info.hasAudio) args.push('-f', 'lavfi', '-i', 'anullsrc=channel_layout=stereo:sample_rate=48000');
	args.push('-filter_complex', `[0:v:0]split=${outputs.length}${split};${scales}`, '-progress', 'pipe:1', '-nostats');
	for (const [i, o] of outputs.entries()) {
		args.push('-map', `[o${i}]`, '-map', info.hasAudio ? '0:a:0' : '1:a:0');
		if (!info.hasAudio) args.push('-shortest');
		args.push('-c:v', 'libx264', '-preset', 'veryfast', '-crf', '23', '-profile:v', 'main', '-pix_fmt', 'yuv420p');
		args.push('-c:a', 'aac', '-b:a', '128k', '-ac', '2', '-movflags', '+faststart', '-map_metadata', '-1', o.path);
	}
	// a generous bound: ten times the clip's length plus two minutes
	const run = await runTool('ffmpeg', args, {
		timeoutMs: (info.durationSeconds * 10 + 120) * 1000,
		onLine: (line) => {
			const p = progressOf(line, info.durationSeconds);
			if (p !== null) onProgress(p);
		}
	}).catch(missingTool);
	if (run.code !== 0) throw new MediaError(`ffmpeg failed (${run.code}): ${run.stderr.trim().split('\n').slice(-3).join(' | ')}`, UNREADABLE);
}

/** One frame a little way in (a first frame is often black) as a JPEG no taller than `height`. */
export async function posterFrame(source: string, path: string, info: Probe, height: number): Promise<void> {
	const at = Math.min(1, info.durationSeconds / 2);
	const args = ['-hide_banner', '-nostdin', '-y', '-ss', at.toFixed(3), '-i', source, '-frames:v', '1', '-vf', `scale=-2:'${evenHeight(height)}'`, '-q:v', '4', path];
	const run = await runTool('ffmpeg', args, { timeoutMs: 60_000 }).catch(missingTool);
	if (run.code !== 0) throw new MediaError(`poster failed: ${run.stderr.trim().split('\n').at(-1) ?? ''}`, UNREADABLE);
}
