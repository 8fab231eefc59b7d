// Help for authors: what each criterion kind measures and which fields it takes, in plain words.
import type { CriterionKind } from './spec';

export const CRITERION_HELP: Record<CriterionKind, string> = {
	'ambient-under':
		'How far the lit frame’s settings sit under the metered ambient. Fields: stops, tolerance (default ⅓), sceneEv (when there is no reference frame), frame, reference.',
	'subject-lift':
		'Stops the flash lifted the subject above the ambient alone, measured against the same subject in the reference frame (so dark skin or kit is judged fairly). Needs a reference frame. Fields: minStops, frame, reference.',
	'background-drop':
		'The background’s measured darkening from reference to lit frame against the settings’ change. A camera’s tone curve can stretch it; such cases go to a mentor. Fields: tolerance (default ½), frame, reference.',
	'shutter-min': 'Shutter at least this fast. Fields: seconds, frame.',
	'shutter-max': 'Shutter at most this fast. Fields: seconds, frame.',
	'aperture-range': 'Aperture between min and max f-numbers (either may be left out). Fields: min, max, frame.',
	'iso-max': 'ISO at most this. Fields: iso, frame.',
	'focal-max': 'Focal length (35 mm equivalent) at most this. Fields: mm35, frame.',
	'focal-min': 'Focal length (35 mm equivalent) at least this. Fields: mm35, frame.',
	'flash-evidence':
		'The flash found in the pixels: a lift on the subject over the ambient alone, whatever the Exif Flash bit says (radio triggers often leave it unset). Needs a reference frame. Fields: minLiftStops (default ½), frame, reference.',
	'background-cooler':
		'Mireds the background’s light renders cooler than the light on the subject (a low-Kelvin white balance with a CTO-gelled flash). With a reference frame, measured on the subject itself. Fields: minMired, frame, reference.',
	bracket: 'Exposure steps between frames from their settings. Fields: offsets (first 0), tolerance, frames.',
	sync: 'Shutter within the camera’s flash sync speed, or above it when high-speed sync is allowed (the verdict states its cost). Fields: syncSpeed (seconds; default the spec’s syncSpeed, else 1/250), highSpeedSync (true/false), frame.',
	'flash-share':
		'The flash’s share of the subject’s light, measured from the pair; for lessons with the sun as a second light. Give share (0.02–0.98, 0.5 = flash equals ambient) or ratioStops (flash over ambient in stops), and tolerance in stops of that ratio (default ½). Needs a reference frame; without one the verdict is left to a mentor. Fields: share or ratioStops, tolerance, frame, reference.',
	'subject-clipping': 'At most this share of the flash-lit subject blown out to white. Fields: maxPercent (default 10), frame, reference.',
	'motion-blur':
		'Blur of a moving subject in pixels, from the frame’s Exif shutter time and 35 mm equivalent focal length and the frame’s width, for a subject at speed (m/s) and distance (m). Learners may give their own speed and distance when they upload. Fields: maxPx, speed, distance, frame.',
	'mentor-judged':
		'Something only a person can judge in the picture (a light pattern, a pose): the verdict hands it to a mentor with your words. Pair it with lightPlan: { minLights } on the spec to have learners attach their Light Plan. Fields: look, frame.'
};
