// The sun as rim and the flash as key: each light in stops from correct, and what they make together on the face.
import { mix } from '$lib/exposure';
import { flashShareOf } from './split';

export interface BlendInput {
	/** The sun on the athlete's edge. */
	rim: number;
	/** Daylight (open sky) on the face in its own shadow. */
	shade: number;
	/** The flash on the face. */
	flash: number;
	background: number;
}

/** The face (flash and sky together), the flash's share of it, key to fill, and rim and background against the face. */
export function daylightBlend(input: BlendInput) {
	const face = mix({ ambientStops: input.shade, flashStops: input.flash });
	// The flash reaches one side of the face; the other side has the sky alone: their difference is key to fill.
	const keyToFillStops = face - input.shade;
	return {
		face,
		share: flashShareOf(input.shade, input.flash),
		keyToFillStops,
		keyToFillRatio: 2 ** keyToFillStops,
		rimOverFace: input.rim - face,
		backgroundUnderFace: input.background - face
	};
}
