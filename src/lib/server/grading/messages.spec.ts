import { describe, expect, it } from 'vitest';
import { ev100 } from '../../exposure/index';
import { adviseExposure, apertureForEv, shutterForEv } from './messages';

describe('advice through the exposure engine', () => {
	it('finds the marked shutter for a wanted EV at a kept aperture and ISO', () => {
		// EV100 = log2(N²/t) (APEX, ASA PH2.5-1960): f/8 at 1/500 s is EV 15; two stops more is 1/2000 s
		const ev = ev100({ aperture: 8, shutter: 1 / 500, iso: 100 });
		expect(shutterForEv(ev + 2, 8, 100)).toBe('1/2000');
		expect(shutterForEv(ev + 2, 8, 400)).toBe('1/8000');
		// beyond the dial (1/32000 s) there is no shutter, so none is offered
		expect(shutterForEv(ev + 8, 8, 100)).toBeNull();
		expect(apertureForEv(ev + 2, 1 / 500, 100)).toBe('f/16');
	});

	it('moves the shutter first (it sets the ambient) and says what changes', () => {
		const ev = ev100({ aperture: 8, shutter: 1 / 500, iso: 100 });
		expect(adviseExposure({ exposureTime: 1 / 500, fNumber: 8, iso: 100 }, ev + 1)).toBe('At f/8, ISO 100 that means 1/1000 s instead of 1/500 s.');
		expect(adviseExposure({ exposureTime: 1 / 500, fNumber: 8, iso: 100 }, ev - 1)).toBe('At f/8, ISO 100 that means 1/250 s instead of 1/500 s.');
		// past the fastest marked shutter the aperture moves instead
		const fast = ev100({ aperture: 4, shutter: 1 / 16000, iso: 100 });
		expect(adviseExposure({ exposureTime: 1 / 16000, fNumber: 4, iso: 100 }, fast + 2)).toBe('At 1/16000 s, ISO 100 that means f/8 instead of f/4.');
		expect(adviseExposure({ exposureTime: 1 / 500, fNumber: 8, iso: 100 }, ev + 0.05)).toBeNull();
	});
});
