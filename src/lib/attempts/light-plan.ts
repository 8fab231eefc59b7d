// The Light Plan's geometry, one copy for the widget that draws it and the server that checks an attached plan.
import type { Point } from '../exposure/index';

/** Camera, subject and one to three lights, in metres (x right, y up the page); lights[0] is the key. */
export interface PlanLayout {
	camera: Point;
	subject: Point;
	lights: Point[];
}

/** Most lights a plan holds. */
export const MAX_LIGHTS = 3;
/** The plan spans −PLAN_HALF … +PLAN_HALF metres each way. */
export const PLAN_HALF = 4;
