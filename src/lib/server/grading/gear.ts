// What an Assignment asks the learner to bring, read from its criteria (for the course's first-visit guide).
import { formatMm } from './format';
import { assignmentSpecSchema, type AssignmentSpecInput, type Criterion } from './spec';

/** One thing to bring, with a why in a few words. */
export interface GearItem {
	id: 'camera' | 'flash' | 'stand' | 'trigger' | 'hss' | 'gel' | 'lens' | 'subject';
	label: string;
}

// The shutter above which a flash must pulse (high-speed sync): sync speeds are typically 1/200–1/250 s
// (common practice, no published source); 1/250 s is the slowest that always needs HSS on such cameras.
const SYNC_SECONDS = 1 / 250;

const FLASH_KINDS = new Set<Criterion['kind']>(['subject-lift', 'flash-evidence']);

/** The gear, in the order a learner packs it; an invalid spec asks for a camera only. */
export function gearFor(spec: AssignmentSpecInput | unknown): GearItem[] {
	const parsed = assignmentSpecSchema.safeParse(spec);
	const criteria = parsed.success ? parsed.data.criteria : [];
	const has = (kind: Criterion['kind']) => criteria.some((c) => c.kind === kind);
	const flash = criteria.some((c) => FLASH_KINDS.has(c.kind));
	const items: GearItem[] = [{ id: 'camera', label: 'A camera you can set by hand (M mode)' }];
	const wide = criteria.find((c) => c.kind === 'focal-max');
	if (wide && wide.kind === 'focal-max') items.push({ id: 'lens', label: `A lens at ${formatMm(wide.mm35)} or wider (full-frame terms)` });
	const long = criteria.find((c) => c.kind === 'focal-min');
	if (long && long.kind === 'focal-min') items.push({ id: 'lens', label: `A lens at ${formatMm(long.mm35)} or longer (full-frame terms)` });
	if (flash) {
		items.push({ id: 'flash', label: 'An off-camera flash' });
		items.push({ id: 'stand', label: 'A light stand and a sandbag' });
		items.push({ id: 'trigger', label: 'A trigger to fire the flash off the camera' });
		const fast = criteria.some((c) => c.kind === 'shutter-min' && c.seconds < SYNC_SECONDS);
		if (fast) items.push({ id: 'hss', label: 'A flash and trigger that do high-speed sync' });
	}
	if (has('background-cooler')) items.push({ id: 'gel', label: 'A full CTO gel for the flash, and a Kelvin white balance' });
	if (flash) items.push({ id: 'subject', label: 'Someone to light, who has agreed to it' });
	return items;
}
