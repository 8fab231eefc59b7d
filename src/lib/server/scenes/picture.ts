// Turns a figure's panels into one picture: each panel rendered in linear light, encoded to sRGB, laid side by side.
import { encodeSrgb, GUTTER, sideBySide, type Picture } from './encode';
import type { RenderedFigure } from './figures';
import { renderScene } from './render';

/** The figure as 8-bit sRGB; `scale` shrinks it (tests render small copies of the same figure). */
export function renderFigure(figure: RenderedFigure, scale = 1, supersample = 2): Picture {
	const width = Math.max(8, Math.round(figure.panelWidth * scale));
	const height = Math.max(8, Math.round(figure.panelHeight * scale));
	const panels = figure.panels.map((p) => encodeSrgb(renderScene(p.scene, p.camera, p.flashes, { width, height, supersample })));
	return panels.length === 1 ? panels[0] : sideBySide(panels);
}

/** Size in pixels of the whole figure at full scale (panels plus gutters). */
export function figureSize(figure: RenderedFigure): { width: number; height: number } {
	const gutter = GUTTER * (figure.panels.length - 1);
	return { width: figure.panelWidth * figure.panels.length + gutter, height: figure.panelHeight };
}
