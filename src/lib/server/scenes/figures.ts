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
	}
];
