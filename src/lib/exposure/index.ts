// Stopwise exposure and lighting engine: pure, isomorphic maths shared by lesson widgets and the grader.
export { ExposureInputError } from './errors';
export * from './apex';
export * from './series';
export * from './format';
export * from './equivalents';
export * from './daylight';
export * from './flash';
export * from './colour';
export * from './srgb';
export * from './chromaticity';
export * from './planckian';
export * from './swatch';
export * from './motion';
export * from './burst';
export * from './geometry';
export type { Vec3, Mat3 } from './matrix';
