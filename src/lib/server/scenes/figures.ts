// Every rendered illustration: which scene, camera settings and flashes make each panel, and what each panel shows.
import type { Vec3 } from '../../exposure/matrix';
import type { Camera, Flash } from './light';
import type { Scene } from './render';
import { fieldDisc, harbourRower, meters, plazaBmx, trailRunner, wallClimber } from './scenes';

/** One panel: a scene as a camera records it, with a short label shown under the picture. */
export interface Panel {
	label: string;
	scene: Scene;
	camera: Camera;
	flashes: Flash[];
}

/** A rendered figure: its file name (without extension), panel size in pixels, and its panels left to right. */
export interface RenderedFigure {
	name: string;
	panelWidth: number;
	panelHeight: number;
	panels: Panel[];
}

const DAYLIGHT_WB = 5500;
const GN_STROBE = 64; // a battery strobe's full-power guide number at ISO 100, metres (invented demo gear)
const GN_SPEEDLIGHT = 40; // a speedlight's, metres (invented demo gear)

const toward = (at: Vec3, aim: Vec3, gn: number, power = 1, extra: Partial<Flash> = {}): Flash => ({ at, aim, gn, power, ...extra });

const runnerKey = (power = 1, extra: Partial<Flash> = {}) => toward([-1.4, 1.7, 2.2], [0.3, 1.1, 3.6], GN_STROBE, power, extra);

const runner = trailRunner('light');
const at = (s: { aperture: number; shutter: number; iso: number }, wbK = DAYLIGHT_WB): Camera => ({ ...s, wbK });
const moving = (scene: Scene, speed: number): Scene => ({ ...scene, athlete: { ...scene.athlete, speed } });
const overcast = (scene: Scene, sceneEv: number): Scene => ({ ...scene, sceneEv, overcast: true, skyShare: 1 });
/** A point `d` metres from `target` towards `from` (a stand moved along the same line). */
const along = (target: Vec3, from: Vec3, d: number): Vec3 => {
	const v = [from[0] - target[0], from[1] - target[1], from[2] - target[2]];
	const l = Math.hypot(v[0], v[1], v[2]);
	return [target[0] + (v[0] / l) * d, target[1] + (v[1] / l) * d, target[2] + (v[2] / l) * d];
};

const rower = harbourRower();
const climber = wallClimber();
const disc = fieldDisc('light');
const bmx = plazaBmx();
const runnerDark = trailRunner('dark');
const runnerChest: Vec3 = [0.3, 1.15, 3.6];
const discChest: Vec3 = [0, 1.6, 4.2];
const bmxChest: Vec3 = [0, 1.0, 3.8];
const W = 400;
const H = 280;

const sunBehind: Scene = { ...trailRunner('light'), sun: [0.7, 0.35, 0.8], skyShare: 0.2 };

/** Which frames of a burst the flash is ready for: it needs `recycle` seconds after each pop; frames come every 1/fps s. */
// Common practice, no published source: recycle time taken as proportional to the power asked (lesson 18's working rule).
export function litFrames(args: { frames: number; fps: number; recycle: number }): boolean[] {
	const lit: boolean[] = [];
	let ready = 0;
	for (let i = 0; i < args.frames; i++) {
		const t = i / args.fps;
		// a small tolerance so a recycle of exactly n frame intervals counts as ready on the nth frame
		const fires = t + 1e-9 >= ready;
		if (fires) ready = t + args.recycle;
		lit.push(fires);
	}
	return lit;
}

/** Five frames of a burst at 10 frames a second, the runner moving 5 m/s; the flash at 1/8 power of a 2 s full-power recycle. */
function burstPanels(): Panel[] {
	const base = trailRunner('light');
	const lit = litFrames({ frames: 5, fps: 10, recycle: 2 * (1 / 8) });
	return lit.map((fires, i) => ({
		label: `Frame ${i + 1}: ${fires ? 'lit' : 'flash recharging'}`,
		scene: { ...base, athlete: { ...base.athlete, x: base.athlete.x - 0.9 + i * 0.5 } },
		camera: at({ ...meters.brightSun, aperture: 16 }),
		flashes: fires ? [runnerKey(1 / 4)] : []
	}));
}

export const renderedFigures: RenderedFigure[] = [
	{
		name: 'landing-ambient',
		panelWidth: 960,
		panelHeight: 640,
		panels: [{ label: 'Daylight only, at the meter: f/11, 1/250 s, ISO 100', scene: runner, camera: at(meters.brightSun), flashes: [] }]
	},
	{
		name: 'landing-relit',
		panelWidth: 960,
		panelHeight: 640,
		panels: [{ label: '2 stops under (f/22) and relit by an off-camera strobe', scene: runner, camera: at({ ...meters.brightSun, aperture: 22 }), flashes: [runnerKey()] }]
	},
	{
		name: 'dim-and-relight',
		panelWidth: 400,
		panelHeight: 300,
		panels: [
			{ label: 'At the meter', scene: runner, camera: at(meters.brightSun), flashes: [] },
			{ label: '2 stops under', scene: runner, camera: at({ ...meters.brightSun, aperture: 22 }), flashes: [] },
			{ label: '2 stops under + flash', scene: runner, camera: at({ ...meters.brightSun, aperture: 22 }), flashes: [runnerKey()] }
		]
	},
	{
		// lesson 1: one scene, four rungs of the ladder, by the shutter alone
		name: 'stop-ladder-rower',
		panelWidth: 300,
		panelHeight: 210,
		panels: [
			{ label: '−2 stops: 1/1000 s', scene: rower, camera: at({ ...meters.hazySun, shutter: 1 / 1000 }), flashes: [] },
			{ label: '−1 stop: 1/500 s', scene: rower, camera: at({ ...meters.hazySun, shutter: 1 / 500 }), flashes: [] },
			{ label: 'At the meter: f/8, 1/250 s', scene: rower, camera: at(meters.hazySun), flashes: [] },
			{ label: '+1 stop: 1/125 s', scene: rower, camera: at({ ...meters.hazySun, shutter: 1 / 125 }), flashes: [] }
		]
	},
	{
		// lesson 2: equivalent exposures record the same light, but not the same picture
		name: 'equivalent-runner',
		panelWidth: W,
		panelHeight: H,
		panels: [
			{ label: 'f/22, 1/60 s: the runner smears', scene: moving(runnerDark, 5), camera: at({ aperture: 22, shutter: 1 / 60, iso: 100 }), flashes: [] },
			{ label: 'f/5.6, 1/1000 s: same brightness, frozen', scene: moving(runnerDark, 5), camera: at({ aperture: 5.6, shutter: 1 / 1000, iso: 100 }), flashes: [] }
		]
	},
	{
		// lesson 3: a bracket of three frames a stop apart
		name: 'bracket-climber',
		panelWidth: 300,
		panelHeight: 260,
		panels: [
			{ label: '−1: 1/500 s', scene: climber, camera: at({ ...meters.brightSun, shutter: 1 / 500 }), flashes: [] },
			{ label: '0: f/11, 1/250 s', scene: climber, camera: at(meters.brightSun), flashes: [] },
			{ label: '+1: 1/125 s', scene: climber, camera: at({ ...meters.brightSun, shutter: 1 / 125 }), flashes: [] }
		]
	},
	{
		// lesson 4: the shutter moves the daylight, not the flash
		name: 'shutter-ambient-bmx',
		panelWidth: W,
		panelHeight: H,
		panels: [
			{ label: 'f/16, 1/60 s: bright plaza, a daylight ghost behind the rider', scene: moving(bmx, 6), camera: at({ ...meters.brightSun, aperture: 16, shutter: 1 / 60 }), flashes: [toward(along(bmxChest, [-2, 2, 1.5], 2.2), bmxChest, GN_SPEEDLIGHT)] },
			{ label: 'f/16, 1/250 s: plaza 2 stops darker, rider unchanged', scene: moving(bmx, 6), camera: at({ ...meters.brightSun, aperture: 16 }), flashes: [toward(along(bmxChest, [-2, 2, 1.5], 2.2), bmxChest, GN_SPEEDLIGHT)] }
		]
	},
	{
		// lesson 5: the sunny-day settings under three skies
		name: 'daylight-conditions',
		panelWidth: 300,
		panelHeight: 220,
		panels: [
			{ label: 'Bright sun, EV 15: f/16, 1/125 s is right', scene: { ...disc, sceneEv: 15 }, camera: at({ aperture: 16, shutter: 1 / 128, iso: 100 }), flashes: [] },
			{ label: 'Overcast, EV 13: the same settings, 2 stops dark', scene: overcast(disc, 13), camera: at({ aperture: 16, shutter: 1 / 128, iso: 100 }), flashes: [] },
			{ label: 'Heavy overcast, EV 12: 3 stops dark', scene: overcast(disc, 12), camera: at({ aperture: 16, shutter: 1 / 128, iso: 100 }), flashes: [] }
		]
	},
	{
		// lesson 8: the same flash moved twice as far along the same line
		name: 'inverse-square-runner',
		panelWidth: W,
		panelHeight: H,
		panels: [
			{ label: 'Strobe 1.6 m from the runner', scene: runnerDark, camera: at({ ...meters.brightSun, aperture: 22 }), flashes: [toward(along(runnerChest, [-1.4, 1.7, 2.2], 1.6), runnerChest, GN_STROBE, 0.25)] },
			{ label: 'Same strobe, 3.2 m away: 2 stops less', scene: runnerDark, camera: at({ ...meters.brightSun, aperture: 22 }), flashes: [toward(along(runnerChest, [-1.4, 1.7, 2.2], 3.2), runnerChest, GN_STROBE, 0.25)] }
		]
	},
	{
		// lesson 9: flash on the camera's axis against flash well off it
		name: 'off-axis-disc',
		panelWidth: W,
		panelHeight: H,
		panels: [
			{ label: 'Flash beside the lens: flat, no shape', scene: disc, camera: at({ ...meters.brightSun, aperture: 22 }), flashes: [toward([0.15, 1.0, 0.3], discChest, GN_STROBE, 1)] },
			{ label: 'Flash 60° off the axis: shape and texture', scene: disc, camera: at({ ...meters.brightSun, aperture: 22 }), flashes: [toward(along(discChest, [-3.6, 2.4, 2.2], 3.9), discChest, GN_STROBE, 1)] }
		]
	},
	{
		// lesson 11: the same ambient at 1/2000 s costs the flash its high-speed-sync loss
		name: 'hss-cost-disc',
		panelWidth: W,
		panelHeight: H,
		panels: [
			{ label: 'f/16, 1/250 s: flash at sync, full output', scene: disc, camera: at({ aperture: 16, shutter: 1 / 250, iso: 100 }), flashes: [toward(along(discChest, [-3, 2.4, 2.2], 3), discChest, GN_STROBE, 1)] },
			{ label: 'f/5.6, 1/2000 s, high-speed sync: same sky, flash 1 stop weaker', scene: disc, camera: at({ aperture: 5.6, shutter: 1 / 2000, iso: 100 }), flashes: [toward(along(discChest, [-3, 2.4, 2.2], 3), discChest, GN_STROBE, 1)] }
		]
	},
	{
		// lesson 12: a moving rider in daylight alone, slow and fast shutter
		name: 'freeze-bmx',
		panelWidth: W,
		panelHeight: H,
		panels: [
			{ label: '1/60 s, daylight only: blurred', scene: moving(bmx, 4), camera: at({ aperture: 22, shutter: 1 / 60, iso: 100 }), flashes: [] },
			{ label: '1/1000 s, daylight only: frozen', scene: moving(bmx, 4), camera: at({ aperture: 5.6, shutter: 1 / 1000, iso: 100 }), flashes: [] }
		]
	},
	{
		// lesson 13: the same daylight scene under two Kelvin settings
		name: 'kelvin-rower',
		panelWidth: W,
		panelHeight: H,
		panels: [
			{ label: 'White balance 5500 K: daylight looks neutral', scene: rower, camera: at(meters.hazySun, 5500), flashes: [] },
			{ label: 'White balance 3200 K: the same daylight renders blue', scene: rower, camera: at(meters.hazySun, 3200), flashes: [] }
		]
	},
	{
		// lesson 14: 3200 K with a bare flash, then with a full CTO on it
		name: 'gel-runner',
		panelWidth: W,
		panelHeight: H,
		panels: [
			{ label: '3200 K, bare flash: the runner turns blue too', scene: runner, camera: at({ ...meters.brightSun, aperture: 22 }, 3200), flashes: [runnerKey()] },
			{ label: '3200 K, full CTO on the flash: blue world, neutral runner', scene: runner, camera: at({ ...meters.brightSun, aperture: 22 }, 3200), flashes: [runnerKey(1, { gel: 'full-cto' })] }
		]
	},
	{
		// lesson 16: a key in front, then a rim light added behind on the other side
		name: 'cross-light-disc',
		panelWidth: W,
		panelHeight: H,
		panels: [
			{ label: 'Key alone, front left', scene: disc, camera: at({ ...meters.brightSun, aperture: 22 }), flashes: [toward(along(discChest, [-3, 2.2, 2.5], 3), discChest, GN_STROBE, 1)] },
			{ label: 'Key plus a rim light behind, right', scene: disc, camera: at({ ...meters.brightSun, aperture: 22 }), flashes: [toward(along(discChest, [-3, 2.2, 2.5], 3), discChest, GN_STROBE, 1), toward(along(discChest, [3, 2.2, 5.6], 2.2), discChest, GN_STROBE, 1)] }
		]
	},
	{
		// lesson 17: wide and close against long and far, the rider the same size
		name: 'wide-close-bmx',
		panelWidth: W,
		panelHeight: H,
		panels: [
			{ label: '85 mm from 9 m: the buildings crowd in behind', scene: { ...bmx, athlete: { ...bmx.athlete, z: 9 }, view: { ...bmx.view, focal35: 85 } }, camera: at(meters.brightSun), flashes: [] },
			{ label: '16 mm from 1.9 m, low: the same-sized rider, the world opens out', scene: { ...bmx, athlete: { ...bmx.athlete, z: 1.9 }, view: { ...bmx.view, height: 0.4, focal35: 16 } }, camera: at(meters.brightSun), flashes: [] }
		]
	},
	{
		// lesson 18: a burst at 10 frames a second with the flash at 1/8 power recycling in 0.25 s: it lights every third frame
		name: 'burst-runner',
		panelWidth: 240,
		panelHeight: 200,
		panels: burstPanels()
	},
	{
		// lesson 19: the sun behind as a rim light; then the ambient a stop under and the flash as the key on the face
		name: 'sun-rim-runner',
		panelWidth: W,
		panelHeight: H,
		panels: [
			{ label: 'Daylight only, at the meter: a bright edge, the face in shadow', scene: sunBehind, camera: at(meters.brightSun), flashes: [] },
			{ label: '1 stop under, flash as the key: lit face, the sun’s rim kept', scene: sunBehind, camera: at({ ...meters.brightSun, aperture: 16 }), flashes: [runnerKey(0.5)] }
		]
	}
];
