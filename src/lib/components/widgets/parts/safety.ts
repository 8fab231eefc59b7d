// Stopwise's own plain safety cautions for lighting people outdoors, one per topic a lesson can ask for.

export const SAFETY_TOPICS = ['general', 'stands', 'wind', 'rain', 'eyes', 'batteries', 'heights', 'water'] as const;
export type SafetyTopic = (typeof SAFETY_TOPICS)[number];

export const SAFETY_CAUTIONS: Readonly<Record<SafetyTopic, { title: string; text: string }>> = {
	general: {
		title: 'Before you start',
		text: 'Ask the organiser before you set up. Tell the athletes and anyone nearby that you will be firing flashes, and ask whether anyone is sensitive to flashing light. Tape cables down or keep them out of walkways, and pack down if conditions change.'
	},
	stands: {
		title: 'Stands near the action',
		text: 'Keep stands, booms and cases out of the line of travel and well clear of run-outs, landing zones and the places a ball, board or bike goes when a move goes wrong. Ask the athlete where they will end up if they miss, leave that clear, and have a helper watch any stand near people.'
	},
	wind: {
		title: 'Wind',
		text: 'Weigh every stand down with sandbags before you raise the light; a softbox or umbrella is a sail. In gusts, lower the light, close the modifier or have someone hold the stand, and never leave a raised light alone.'
	},
	rain: {
		title: 'Rain and mains power',
		text: 'Mains-powered strobes, extension leads and power packs do not belong in rain or on wet ground. Use battery units, protect them from water, and stop shooting if water reaches any electrical part.'
	},
	eyes: {
		title: "Flash and the athlete's eyes",
		text: "Never fire a flash into a rider's, climber's or runner's eyes while they are in the middle of a move: a burst at the wrong moment can dazzle them when they need their sight most. Agree with them when and from where you will fire, light from the side or behind, and do a test flash before they start."
	},
	batteries: {
		title: 'Batteries',
		text: 'Lithium flash batteries can overheat or catch fire when damaged, crushed or short-circuited. Carry them in covers with the contacts capped, charge them where you can watch them, and stop using any pack that is swollen, hot or dented.'
	},
	heights: {
		title: 'Working at height',
		text: 'On ladders, walls, ramps or banks, make sure of your footing and have a second person with you. Tie off anything that could fall, and keep people and gear clear of the area below. Follow the venue\'s rules on who may climb, where and with what equipment.'
	},
	water: {
		title: 'Near water',
		text: 'Keep mains power away from water entirely, stay back from edges and banks, and put a strap on every camera and light. On or beside boats, follow the crew\'s and the club\'s safety briefing and wear a buoyancy aid when they ask.'
	}
};

/** The closing line every Safety note ends with. */
export const SAFETY_DEFERENCE =
	'These are plain cautions, not a safety plan. Venue rules, the event organiser, local codes and regulations, and licensed professionals (an electrician for mains power, a rigger for anything overhead) come first.';
