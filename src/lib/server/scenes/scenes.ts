// The invented locations of the demo club, each with its athlete, daylight and camera place: the sets the figures reuse.
import { ev100, type ExposureSettings } from '../../exposure/apex';
import { palette } from './palettes';
import type { Scene } from './render';

/** Meter readings (ISO 100) of the demo days; each scene's EV is the meter's, so "at the meter" renders an 18 % card as middle grey. */
// Sunny-16 style readings: common practice, no published source (see the engine's daylight table).
export const meters = {
	brightSun: { aperture: 11, shutter: 1 / 250, iso: 100 },
	hazySun: { aperture: 8, shutter: 1 / 250, iso: 100 },
	overcast: { aperture: 5.6, shutter: 1 / 250, iso: 100 }
} satisfies Record<string, ExposureSettings>;

const orange: [number, number, number] = [0.6, 0.15, 0.03];
const teal: [number, number, number] = [0.03, 0.3, 0.3];
const red: [number, number, number] = [0.45, 0.04, 0.04];
const yellow: [number, number, number] = [0.6, 0.45, 0.03];

/** A trail runner on the hill path, the sun behind and to the left: the athlete's front is in shade. */
export function trailRunner(kit: 'light' | 'dark' = 'light'): Scene {
	return {
		setting: 'trail', seed: 7, sceneEv: ev100(meters.brightSun), sun: [-0.5, 0.6, 0.9], skyShare: 0.25,
		athlete: { kind: 'runner', x: 0.3, z: 3.6, palette: palette({ skin: 'medium', kit, accent: orange }) },
		view: { height: 0.7, focal35: 24, horizon: 0.6 }
	};
}

/** A single sculler on the harbour at the finish of the stroke, hazy sun from the side. */
export function harbourRower(): Scene {
	return {
		setting: 'water', seed: 11, sceneEv: ev100(meters.hazySun), sun: [0.8, 0.5, 0.3], skyShare: 0.35,
		athlete: { kind: 'rower', x: -0.2, z: 5, palette: palette({ skin: 'fair', kit: 'dark', accent: red, hair: [0.25, 0.12, 0.05] }) },
		view: { height: 1.1, focal35: 50, horizon: 0.4 }
	};
}

/** A climber on the outdoor wall, the sun high behind the wall so its face is in shade. */
export function wallClimber(): Scene {
	return {
		setting: 'wall', seed: 5, sceneEv: ev100(meters.brightSun), sun: [0.3, 0.8, 0.6], skyShare: 0.3,
		athlete: { kind: 'climber', x: 0.1, y: 1.9, z: 4.7, palette: palette({ skin: 'deep', kit: 'light', accent: yellow }) },
		view: { height: 1.4, focal35: 35, horizon: 0.95 }
	};
}

/** An ultimate player leaping for the disc on the club field, sun low and behind. */
export function fieldDisc(kit: 'light' | 'dark' = 'light'): Scene {
	return {
		setting: 'field', seed: 3, sceneEv: ev100(meters.brightSun), sun: [0.4, 0.5, 0.8], skyShare: 0.3,
		athlete: { kind: 'disc', x: 0, y: 0.45, z: 4.2, palette: palette({ skin: 'medium', kit, accent: [0.85, 0.85, 0.8] }) },
		view: { height: 0.9, focal35: 35, horizon: 0.66 }
	};
}

/** A flatland BMX rider on the plaza in front of the clubhouse, open afternoon light. */
export function plazaBmx(): Scene {
	return {
		setting: 'plaza', seed: 9, sceneEv: ev100(meters.brightSun), sun: [-0.6, 0.6, 0.5], skyShare: 0.3,
		athlete: { kind: 'bmx', x: 0, z: 3.8, palette: palette({ skin: 'fair', kit: 'dark', accent: teal }) },
		view: { height: 0.8, focal35: 28, horizon: 0.58 }
	};
}
