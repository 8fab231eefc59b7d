// What each criterion kind and field is called in the spec form, with its unit and plain-language help.
// One entry per kind: a new kind appears in the form by its schema alone, and in words once it has an entry here.

import type { FieldInput } from '../../authoring/spec-draft';

export interface FieldWords {
	label: string;
	help: string;
	unit?: string;
	/** how the form edits it, when the schema's type alone does not say (seconds typed as 1/1000) */
	input?: FieldInput;
	step?: number;
	/** the value a new criterion starts with, for a required field */
	example?: unknown;
}

export interface KindWords {
	label: string;
	help: string;
	fields: Record<string, FieldWords>;
}

/** Fields many kinds share; a kind's own entry wins. */
export const COMMON_FIELDS: Record<string, FieldWords> = {
	frame: { label: 'Graded frame', help: 'The frame this checks. Left on the default, it is the last frame listed.', input: 'frame' },
	reference: { label: 'Reference frame', help: 'The ambient-only frame it compares with. Left on the default, it is the first frame listed.', input: 'frame' },
	tolerance: { label: 'Tolerance', unit: 'stops', step: 0.01, help: 'How far either side of the target still passes. 0.34 is a third of a stop.' }
};

export const CRITERION_WORDS: Record<string, KindWords> = {
	'ambient-under': {
		label: 'Ambient under the meter',
		help: 'How far the lit frame’s settings sit under the metered ambient: this is what darkens the background.',
		fields: {
			stops: { label: 'Stops under', unit: 'stops', step: 0.01, example: 1.5, help: 'How many stops under the ambient reading, e.g. 1.5.' },
			sceneEv: { label: 'Scene EV', unit: 'EV at ISO 100', step: 0.1, help: 'Only when there is no reference frame: the metered scene, e.g. 15 for bright sun.' }
		}
	},
	'subject-lift': {
		label: 'Subject lifted by flash',
		help: 'How much brighter the subject reads than the background in the graded frame.',
		fields: { minStops: { label: 'At least', unit: 'stops', step: 0.1, example: 1, help: 'The smallest lift that passes, e.g. 1 stop.' } }
	},
	'background-drop': {
		label: 'Background darkened as the settings say',
		help: 'Cross-check: the background’s measured darkening from reference to lit frame must agree with the change of settings.',
		fields: { tolerance: { label: 'Tolerance', unit: 'stops', step: 0.01, help: 'How far pixels and settings may disagree, e.g. 0.5 stop.' } }
	},
	'shutter-min': {
		label: 'Shutter at least this fast',
		help: 'The exposure time must be this short or shorter: freezes action and darkens the ambient.',
		fields: { seconds: { label: 'Shutter', unit: 's', input: 'seconds', example: 0.001, help: 'Type it as on the camera, e.g. 1/1000.' } }
	},
	'shutter-max': {
		label: 'Shutter at most this fast',
		help: 'The exposure time must be this long or longer, e.g. to drag the shutter.',
		fields: { seconds: { label: 'Shutter', unit: 's', input: 'seconds', example: 1 / 60, help: 'Type it as on the camera, e.g. 1/60.' } }
	},
	'aperture-range': {
		label: 'Aperture within a range',
		help: 'The f-number must sit between the two (either may be left empty).',
		fields: {
			min: { label: 'Widest', unit: 'f-number', step: 0.1, example: 4, help: 'The smallest f-number allowed, e.g. 4.' },
			max: { label: 'Narrowest', unit: 'f-number', step: 0.1, help: 'The largest f-number allowed, e.g. 11.' }
		}
	},
	'iso-max': {
		label: 'ISO at most',
		help: 'Keeps noise down and makes the flash do the work.',
		fields: { iso: { label: 'Highest ISO', unit: 'ISO', step: 1, example: 400, help: 'e.g. 400.' } }
	},
	'focal-max': {
		label: 'Lens this wide or wider',
		help: 'The 35 mm equivalent focal length must be this short or shorter.',
		fields: { mm35: { label: 'Longest', unit: 'mm (35 mm equivalent)', step: 1, example: 35, help: 'e.g. 35.' } }
	},
	'focal-min': {
		label: 'Lens this long or longer',
		help: 'The 35 mm equivalent focal length must be this long or longer.',
		fields: { mm35: { label: 'Shortest', unit: 'mm (35 mm equivalent)', step: 1, example: 85, help: 'e.g. 85.' } }
	},
	'flash-evidence': {
		label: 'The flash fired',
		help: 'The camera’s Flash tag, else the subject’s lift; when the file cannot tell, a mentor decides (never a fail).',
		fields: { minLiftStops: { label: 'Lift that counts as flash', unit: 'stops', step: 0.1, help: 'Subject lift beyond what the ambient explains, e.g. 0.5.' } }
	},
	'background-cooler': {
		label: 'Background cooler than the subject',
		help: 'The colour gap a low Kelvin white balance and a CTO gel make: the sky bluer than the skin.',
		fields: { minMired: { label: 'At least', unit: 'mireds', step: 1, example: 100, help: 'A full CTO gel adds about 160 mireds; e.g. 100.' } }
	},
	sync: {
		label: 'Within the flash sync speed',
		help: 'The shutter stays within the camera’s sync speed, or above it when high-speed sync is allowed (the verdict states its cost in flash power).',
		fields: {
			syncSpeed: { label: 'Sync speed', unit: 's', input: 'seconds', help: 'The camera’s, e.g. 1/250. Left empty: the spec’s sync speed, else 1/250.' },
			highSpeedSync: { label: 'High-speed sync allowed', input: 'boolean', help: 'Tick when the assignment is about going above sync speed.' }
		}
	},
	'flash-share': {
		label: 'Flash’s share of the subject’s light',
		help: 'How much of the subject’s light comes from the flash, measured from the pair: for the sun as a second light. Give a share or a ratio.',
		fields: {
			share: { label: 'Share from the flash', unit: '0.02–0.98', step: 0.01, example: 0.5, help: '0.5 means flash and daylight equal on the subject.' },
			ratioStops: { label: 'Or flash over ambient', unit: 'stops', step: 0.1, help: 'Instead of a share: 0 equal, +1 flash twice the daylight.' },
			tolerance: { label: 'Tolerance', unit: 'stops', step: 0.1, help: 'How far the ratio may miss, e.g. 0.5 stop.' }
		}
	},
	'subject-clipping': {
		label: 'Subject not blown out',
		help: 'At most this share of the flash-lit subject may clip to white.',
		fields: { maxPercent: { label: 'At most', unit: '% of the subject', step: 1, help: 'e.g. 10.' } }
	},
	'motion-blur': {
		label: 'Subject frozen (blur in pixels)',
		help: 'Blur across the frame from the Exif shutter and focal length for a subject moving at the stated speed and distance; the learner may state their own on the upload form.',
		fields: {
			maxPx: { label: 'At most', unit: 'px of blur', step: 1, example: 4, help: 'e.g. 4 pixels on the long side.' },
			speed: { label: 'Subject speed', unit: 'm/s', step: 0.5, example: 5, help: 'A runner is about 5 m/s.' },
			distance: { label: 'Camera to subject', unit: 'm', step: 0.5, example: 5, help: 'Metres from the camera to the subject.' },
			stated: { label: 'Speed stated by the learner', help: 'Set by the upload form, not by authors.' }
		}
	},
	'mentor-judged': {
		label: 'Judged by a mentor',
		help: 'What only a person can judge in the picture, such as a light pattern on a face: the frame goes to a mentor with what to look for.',
		fields: { look: { label: 'What to look for', example: 'A small triangle of light under the far eye', help: 'One or two sentences for the mentor.' } }
	},
	bracket: {
		label: 'Bracket steps',
		help: 'Each frame’s exposure, from its settings, relative to the first.',
		fields: {
			offsets: { label: 'Steps', unit: 'EV from the first', input: 'numbers', example: [0, -1, 1], help: 'One per frame, the first 0; e.g. 0, -1, 1 (+1 is one stop more light).' },
			frames: { label: 'Frames in bracket order', input: 'frames', help: 'Left empty, all frames in the order listed.' }
		}
	}
};
