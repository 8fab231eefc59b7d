// Decodes the Exif Flash tag (0x9209), a bit field defined in CIPA DC-008 (Exif 2.32, 4.6.5).

export type FlashReturnLight = 'no-detection' | 'reserved' | 'not-detected' | 'detected';
export type FlashMode = 'unknown' | 'compulsory-on' | 'compulsory-off' | 'auto';

export interface FlashInfo {
	fired: boolean;
	/** Bits 1–2: whether the camera's strobe-return detection saw the flash come back. */
	returnLight: FlashReturnLight;
	/** Bits 3–4: how the camera was set to fire it. */
	mode: FlashMode;
	/** Bit 5 clear means the camera has a flash function. */
	functionPresent: boolean;
	redEyeReduction: boolean;
	raw: number;
}

const RETURN_LIGHT: readonly FlashReturnLight[] = ['no-detection', 'reserved', 'not-detected', 'detected'];
const MODE: readonly FlashMode[] = ['unknown', 'compulsory-on', 'compulsory-off', 'auto'];

/** null when the value is not a 16-bit integer (a tag that is missing or malformed is not a guess). */
export function decodeFlash(raw: unknown): FlashInfo | null {
	if (typeof raw !== 'number' || !Number.isInteger(raw) || raw < 0 || raw > 0xffff) return null;
	return {
		fired: (raw & 0x01) === 1,
		returnLight: RETURN_LIGHT[(raw >> 1) & 0x03],
		mode: MODE[(raw >> 3) & 0x03],
		functionPresent: (raw & 0x20) === 0,
		redEyeReduction: (raw & 0x40) !== 0,
		raw
	};
}

const MODE_WORDS: Record<FlashMode, string> = {
	unknown: 'mode unknown',
	'compulsory-on': 'forced on',
	'compulsory-off': 'forced off',
	auto: 'auto mode'
};

/** "fired, auto mode, return light detected" — for tables and mentor views. */
export function describeFlash(flash: FlashInfo): string {
	const parts = [flash.fired ? 'fired' : 'did not fire', MODE_WORDS[flash.mode]];
	if (flash.returnLight === 'detected') parts.push('return light detected');
	if (flash.returnLight === 'not-detected') parts.push('return light not detected');
	if (!flash.functionPresent) parts.push('no flash function');
	return parts.join(', ');
}
