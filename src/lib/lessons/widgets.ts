// The lesson widget tags authors may use, with the string attributes each takes, and the rendered-lesson segment type.
// Shared by the server renderer (the allow-list) and the page that mounts the widgets (the tag → component map).

/** Tag name → attributes it accepts (the contract lessons are written against, see the widget components). */
export const WIDGET_ATTRIBUTES = {
	StopLadder: ['aperture', 'shutter', 'iso'],
	AmbientDimmer: ['scene', 'under', 'sync', 'iso'],
	FalloffRuler: ['gn', 'power', 'distance', 'iso', 'aperture'],
	SyncGate: ['shutter', 'sync', 'entry'],
	ExposureSplit: ['scene', 'aperture', 'shutter', 'iso', 'gn', 'power', 'distance', 'sync'],
	DaylightBlend: ['rim', 'shade', 'flash', 'background'],
	BurstBudget: ['power', 'recycle', 'fps', 'frames', 'hss'],
	GelMixer: ['ambient', 'flash', 'gel', 'wb'],
	LightPlan: ['preset'],
	FreezeMeter: ['speed', 'distance', 'focal', 'sensor', 'pixels', 'shutter'],
	SafetyNote: ['topics'],
	Quiz: ['id', 'question', 'answer', 'tolerance', 'unit', 'choices'],
	AssignmentCard: ['slug'],
	Figure: ['name', 'alt', 'caption'],
	Clip: ['name']
} as const satisfies Record<string, readonly string[]>;

export type WidgetName = keyof typeof WIDGET_ATTRIBUTES;

export const WIDGET_NAMES = Object.keys(WIDGET_ATTRIBUTES) as WidgetName[];

export function isWidgetName(name: string): name is WidgetName {
	return Object.hasOwn(WIDGET_ATTRIBUTES, name);
}

/** A rendered lesson: sanitised HTML between widgets, each widget with plain string props. */
export type LessonSegment = { kind: 'html'; html: string } | { kind: 'widget'; name: WidgetName; props: Record<string, string> };
