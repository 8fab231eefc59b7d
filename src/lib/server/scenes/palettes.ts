// Colours (linear reflectances) for the invented athletes: skin tones, light or dark kit, gear.
import type { Vec3 } from '../../exposure/matrix';
import type { Material } from './athletes';

/** Skin reflectances by tone, chosen by eye (roughly the range of measured skin albedo, from memory: ~0.1–0.45). */
export const skinTones: Readonly<Record<'fair' | 'medium' | 'deep', Vec3>> = {
	fair: [0.5, 0.33, 0.25],
	medium: [0.32, 0.19, 0.12],
	deep: [0.13, 0.075, 0.05]
};

/** A light kit (pale shirt) is easy to blow out under flash; a dark kit swallows light: both are worth seeing. */
export function palette(args: { skin: keyof typeof skinTones; kit: 'light' | 'dark'; accent: Vec3; hair?: Vec3 }): Record<Material, Vec3> {
	const light = args.kit === 'light';
	return {
		skin: skinTones[args.skin],
		hair: args.hair ?? [0.03, 0.025, 0.02],
		top: light ? [0.62, 0.6, 0.55] : [0.03, 0.04, 0.08],
		bottom: light ? [0.05, 0.05, 0.06] : [0.035, 0.035, 0.04],
		shoe: [0.5, 0.5, 0.5],
		gear: [0.06, 0.06, 0.065],
		accent: args.accent
	};
}
