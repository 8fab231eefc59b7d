// Example widget tags the editor can insert: one per widget, with the attributes it takes (see the widget contract).
import type { WidgetName } from '$lib/lessons/widgets';

export const WIDGET_SNIPPETS: Record<WidgetName, string> = {
	StopLadder: '<StopLadder aperture="8" shutter="1/250" iso="100" />',
	AmbientDimmer: '<AmbientDimmer scene="bright-sun" under="2" sync="1/250" iso="100" />',
	FalloffRuler: '<FalloffRuler gn="60" power="1/4" distance="3" iso="100" aperture="8" />',
	SyncGate: '<SyncGate shutter="1/1000" sync="1/250" entry="1" />',
	DaylightBlend: '<DaylightBlend rim="0" shade="-3" flash="-0.2" background="-1" />',
	BurstBudget: '<BurstBudget power="1/8" recycle="2" fps="10" frames="10" hss="0" />',
	ExposureSplit: '<ExposureSplit scene="14" aperture="8" shutter="1/250" iso="100" gn="60" power="1/4" distance="3" sync="1/250" />',
	GelMixer: '<GelMixer ambient="5600" flash="5600" gel="full-cto" wb="3200" />',
	LightPlan: '<LightPlan preset="rembrandt" />',
	FreezeMeter: '<FreezeMeter speed="6" distance="5" focal="24" sensor="36" pixels="6000" shutter="1/1000" />',
	SafetyNote: '<SafetyNote topics="stands,eyes" />',
	Quiz: '<Quiz id="question-1" question="Write the question here (no double quotes)" answer="1" tolerance="0" unit="" />',
	AssignmentCard: '<AssignmentCard slug="assignment-slug" />',
	Figure: '<Figure name="dim-and-relight" alt="Say what the picture shows (no double quotes)" caption="What to notice" />',
	Clip: '<Clip name="clip-name" />'
};

/** Puts `text` at the cursor as a block of its own: blank lines around it, so a widget stands on its own line. */
export function insertBlock(body: string, start: number, end: number, text: string): { body: string; cursor: number } {
	const before = body.slice(0, start);
	const after = body.slice(end);
	const lead = before === '' || before.endsWith('\n\n') ? '' : before.endsWith('\n') ? '\n' : '\n\n';
	const trail = after === '' ? '\n' : after.startsWith('\n\n') ? '' : after.startsWith('\n') ? '\n' : '\n\n';
	const inserted = `${lead}${text}${trail}`;
	return { body: before + inserted + after, cursor: before.length + inserted.length };
}
