import { describe, expect, it } from 'vitest';
import { gearFor } from './gear';

const ids = (spec: unknown) => gearFor(spec).map((g) => g.id);

describe('gearFor', () => {
	it('asks only for a camera when no flash is involved', () => {
		expect(ids({ frames: ['base', 'minus-one', 'minus-two'], criteria: [{ kind: 'bracket', offsets: [0, -1, -2] }] })).toEqual(['camera']);
	});

	it('asks for flash, stand, trigger and a willing subject when the subject must be lit', () => {
		expect(ids({ frames: ['reference', 'lit'], criteria: [{ kind: 'ambient-under', stops: 1.5 }, { kind: 'subject-lift', minStops: 1 }] })).toEqual([
			'camera',
			'flash',
			'stand',
			'trigger',
			'subject'
		]);
	});

	it('asks for high-speed sync above the sync speed, a gel for a cooler background, and the lens a focal limit needs', () => {
		const items = gearFor({
			frames: ['reference', 'lit'],
			criteria: [
				{ kind: 'shutter-min', seconds: 0.001 },
				{ kind: 'subject-lift', minStops: 1 },
				{ kind: 'background-cooler', minMired: 60 },
				{ kind: 'focal-max', mm35: 35 }
			]
		});
		expect(items.map((g) => g.id)).toEqual(['camera', 'lens', 'flash', 'stand', 'trigger', 'hss', 'gel', 'subject']);
		expect(items.find((g) => g.id === 'lens')?.label).toBe('A lens at 35 mm or wider (full-frame terms)');
	});

	it('needs no high-speed sync at or below 1/250 s', () => {
		expect(ids({ frames: ['lit'], criteria: [{ kind: 'shutter-min', seconds: 1 / 250 }, { kind: 'subject-lift', minStops: 1 }] })).not.toContain('hss');
	});

	it('falls back to a camera for a spec it cannot read', () => {
		expect(ids({ nonsense: true })).toEqual(['camera']);
		expect(ids(null)).toEqual(['camera']);
	});
});
