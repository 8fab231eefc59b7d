// The instructors' public profiles (the demo's one is invented and says so), and which course each teaches.
import { and, asc, eq, inArray } from 'drizzle-orm';
import { db } from './db';
import { courses } from './db/schema';

/** A public instructor profile: who they are, what they teach, and the drawn portrait from `$lib/illustrations`. */
export interface InstructorProfile {
	slug: string;
	name: string;
	role: string;
	/** True for the demo's made-up people: the page says so beside the name. */
	invented: boolean;
	portrait: string;
	portraitAlt: string;
	courses: string[];
	bio: string[];
	teaches: string[];
	kit: string[];
}

const profiles: readonly InstructorProfile[] = [
	{
		slug: 'jun-halvorsen',
		name: 'Jun Halvorsen',
		role: 'Photography coach, Harbor Lane Athletics',
		invented: true,
		portrait: 'portrait-jun-halvorsen',
		portraitAlt: 'A drawn portrait of Jun Halvorsen: short dark hair, a close beard, a field jacket with a camera strap, lit warm against a deep blue sky.',
		courses: ['daylight-flash-for-action'],
		bio: [
			'Jun started photographing the club’s Saturday trail races from the back of the field, with one speedlight on a pole and a memory card full of silhouettes. Twelve seasons later Jun runs the photography side of Harbor Lane Athletics: race mornings on the hill path, the rowing regatta, open evenings at the climbing wall, the ultimate league and the BMX jam on the clubhouse plaza.',
			'Jun teaches with numbers you can check: meter the sky, count the stops under it, put the light where the athlete will be, then read the frame afterwards to see whether it did what you meant. The course grew out of the notes Jun hands to club volunteers before their first event.',
			'On a field day Jun is the one walking the course first with a tape measure, deciding where a stand can go without being in anyone’s way, and checking with the race marshal before a single flash goes up.'
		],
		teaches: [
			'Dimming the daylight by a counted number of stops',
			'Off-camera flash placed well away from the lens, by the inverse-square law',
			'Sync speed, high-speed sync and when a bigger strobe farther back is the safer answer',
			'Kelvin white balance with a CTO gel: a blue world and a neutral athlete'
		],
		kit: [
			'Two battery strobes, guide number about 60 m at ISO 100',
			'Two speedlights and radio triggers',
			'Full and half CTO gels',
			'Four stands, each with a sandbag',
			'A tape measure and a notebook'
		]
	}
];

/** The profile at `/instructors/<slug>`, or null. */
export function instructorBySlug(slug: string): InstructorProfile | null {
	return profiles.find((p) => p.slug === slug) ?? null;
}

/** The profile of whoever teaches the course `courseSlug`, or null when it has none yet. */
export function instructorForCourse(courseSlug: string): InstructorProfile | null {
	return profiles.find((p) => p.courses.includes(courseSlug)) ?? null;
}

/** The published courses a profile lists, by title: a course still being written stays off the public page. */
export async function publishedCoursesOf(profile: InstructorProfile): Promise<{ slug: string; title: string; summary: string }[]> {
	if (profile.courses.length === 0) return [];
	return db
		.select({ slug: courses.slug, title: courses.title, summary: courses.summary })
		.from(courses)
		.where(and(inArray(courses.slug, profile.courses), eq(courses.published, true)))
		.orderBy(asc(courses.title));
}
