// Stopwise's own plain safety cautions for lighting people outdoors, one per topic a lesson can ask for.
import { SAFETY_TOPICS, type SafetyTopic } from '$lib/safety-topics';

export { SAFETY_TOPICS, type SafetyTopic };

export const SAFETY_CAUTIONS: Readonly<Record<SafetyTopic, { title: string; text: string }>> = {
	general: {
		title: 'Before you start',
		text: 'Ask the organiser before you set up. Tell the athletes and anyone nearby that you will be firing flashes, and ask whether anyone is sensitive to flashing light. Tape cables down or keep them out of walkways, and pack down if conditions change.'
	},
	stands: {
		title: 'Stands near the action',
		text: 'Keep stands, booms and cases out of the line of travel and well clear of run-outs, landing zones and the places a ball, board or bike goes when a move goes wrong. Ask the athlete where they will end up if they miss, leave that clear, and have a helper watch any stand near people.'
	},
	'tall-stands': {
		title: 'Tall stands',
		text: 'A light raised high is top-heavy and catches every gust. Sandbag each leg, guy the stand with lines to fixed points, keep the ground it could fall onto clear of people, crash mats and the climbing or playing area, and keep a helper beside it the whole time it is up.'
	},
	wind: {
		title: 'Wind',
		text: 'Weigh every stand down with sandbags before you raise the light; a softbox or umbrella is a sail. In gusts, lower the light, close the modifier or have someone hold the stand, and never leave a raised light alone.'
	},
	rain: {
		title: 'Rain and mains power',
		text: 'Mains-powered strobes, extension leads and power packs do not belong in rain or on wet ground. Use battery units, protect them from water, and stop shooting if water reaches any electrical part.'
	},
	thunder: {
		title: 'Thunder and lightning',
		text: 'If you can hear thunder, lightning can reach you. Lower and pack away tall metal stands and booms at once, above all on open fields, hills and by water, and leave exposed ground. Set up again only when the storm has clearly passed and the organiser says so; weather services commonly advise waiting at least 30 minutes after the last thunder.'
	},
	eyes: {
		title: "Flash and the athlete's eyes",
		text: "Never fire a flash into a rider's, climber's or runner's eyes while they are in the middle of a move: a burst at the wrong moment can dazzle them when they need their sight most. Agree with them when and from where you will fire, light from the side or behind, and do a test flash before they start."
	},
	flashing: {
		title: 'People sensitive to flashing light',
		text: 'Repeated flashes and bursts can trigger seizures or migraines in people with photosensitive epilepsy and similar conditions, athletes and onlookers alike. Ask before you start, say when a burst is coming, keep bursts short with pauses between them, and stop at once if anyone says the light bothers them.'
	},
	heat: {
		title: 'Heat from bursts and high-speed sync',
		text: 'Long bursts, full power and high-speed sync heat a flash head fast. Many heads cut out to protect themselves: let them cool rather than forcing them on. The front of a hot head can burn skin and scorch or melt a gel or diffuser laid on it, so use a holder that keeps the gel off the tube, handle the head by its body, and keep to the maker\'s limit on flashes in a row.'
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
		text: 'Keep mains power away from water entirely, stay back from edges and banks, and put a strap on every camera and light. Wear a buoyancy aid on docks, pontoons and boats at all times, not only when asked, and follow the crew\'s and the club\'s safety briefing.'
	}
};

/** The closing line every Safety note ends with. */
export const SAFETY_DEFERENCE =
	'These are plain cautions, not a safety plan. Venue rules, the event organiser, local codes and regulations, and licensed professionals (an electrician for mains power, a rigger for anything overhead) come first.';
