// The invented demo field days of Harbor Lane Athletics (people, places and times made up); seeding twice changes nothing.
import { eq } from 'drizzle-orm';
import type { Db } from '../db';
import { assignments, courses, fieldDays, users } from '../db/schema';
import { zonedToInstant } from './zoned-time';

/** The briefing every demo day carries: the usual cautions, then the venue's rules and local codes first. */
export const demoSafetyBriefing = [
	'Light stands stay outside the running line and well clear of ramps, balls and bikes; the mentor on duty checks each position before the first run.',
	'Every stand is sandbagged; in wind add a second bag and lower the stand, and take modifiers off when gusts pick up.',
	'In rain use battery strobes only (no mains-powered flash or extension leads on wet ground) and keep heads and batteries covered.',
	'Never fire a flash into a rider’s or runner’s eyes mid-manoeuvre: light from the side, agree a cue with each athlete before their run, and stop if they ask.',
	'The venue’s rules and local codes come first; the mentor on duty may stop any set-up.'
].join(' ');

type DemoDay = {
	slug: string;
	title: string;
	summary: string;
	start: string;
	end: string;
	meetingPoint: string;
	latitude: number;
	longitude: number;
	seats: number;
	priceCents: number;
	includedWithEnrolment: boolean;
	kitList: string;
	assignment: string;
};

const timeZone = 'America/New_York';
// invented venues of the invented club; coordinates are made up for the demo
const days: DemoDay[] = [
	{
		slug: 'trail-running-first-light',
		title: 'Trail running at first light (demo)',
		summary: 'Runners of Harbor Lane Athletics on the ridge path at sunrise: dim the sky two stops, freeze the stride with a strobe from the side.',
		start: '2027-05-15T06:30',
		end: '2027-05-15T10:00',
		meetingPoint: 'Harbor Lane Athletics trailhead car park, by the green gate (invented venue)',
		latitude: 41.5012,
		longitude: -71.3127,
		seats: 8,
		priceCents: 4500,
		includedWithEnrolment: false,
		kitList: 'Camera and a wide lens, one speedlight or battery strobe with a radio trigger, a light stand and two sandbags, a full CTO gel, spare batteries, rain cover.',
		assignment: 'freeze-the-moment'
	},
	{
		slug: 'bmx-flatland-afternoon',
		title: 'BMX flatland afternoon (demo)',
		summary: 'Flatland riders on the club’s smooth court: high-speed sync against the afternoon sun, lights kept out of the riders’ way.',
		start: '2027-06-12T14:00',
		end: '2027-06-12T17:30',
		meetingPoint: 'Harbor Lane Athletics court, south entrance (invented venue)',
		latitude: 41.4987,
		longitude: -71.3089,
		seats: 6,
		priceCents: 0,
		includedWithEnrolment: true,
		kitList: 'Camera, a strobe that can do high-speed sync, a radio trigger, a stand with sandbags, ND filter optional.',
		assignment: 'beat-the-sun'
	}
];

export async function seedDemoFieldDays(db: Db): Promise<void> {
	const course = await db.query.courses.findFirst({ where: eq(courses.slug, 'daylight-flash-for-action') });
	if (!course) return;
	const mentor = await db.query.users.findFirst({ where: eq(users.email, 'mentor@harborlane.example') });
	for (const d of days) {
		const assignment = await db.query.assignments.findFirst({ where: eq(assignments.slug, d.assignment) });
		await db
			.insert(fieldDays)
			.values({
				slug: d.slug,
				courseId: course.id,
				assignmentId: assignment?.id ?? null,
				title: d.title,
				summary: d.summary,
				startsAt: zonedToInstant(d.start, timeZone),
				endsAt: zonedToInstant(d.end, timeZone),
				timeZone,
				meetingPoint: d.meetingPoint,
				latitude: d.latitude,
				longitude: d.longitude,
				seats: d.seats,
				priceCents: d.priceCents,
				currency: course.currency,
				includedWithEnrolment: d.includedWithEnrolment,
				refundHours: 48,
				kitList: d.kitList,
				safetyBriefing: demoSafetyBriefing,
				mentorIds: mentor ? [mentor.id] : []
			})
			.onConflictDoNothing({ target: fieldDays.slug });
	}
}
