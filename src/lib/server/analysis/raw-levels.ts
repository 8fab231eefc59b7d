// Where mid-grey sits in a raw file's linear data, and how raw levels map onto the scale the analysis measures on.

/**
 * Share of the sensor's white level at which a correctly metered 18 % grey lands in raw data.
 * ISO 12232 (saturation-based speed): S_sat = 78 / H_sat, while a meter calibrated to the same speed gives the
 * mid-tone exposure H = 10 / S; mid-grey therefore sits at 10/78 ≈ 12.8 % of saturation (18 % / √2, half a stop of
 * headroom above the JPEG's 18 %). Values from memory of ISO 12232:2019 section 6.2 and the usual account of it.
 */
export const RAW_MID_GREY_SHARE = 10 / 78;

/**
 * The analysis measures in linear light with mid-grey at 0.18 (an sRGB JPEG's scale, see pixels.ts MID_GREY): raw data
 * as a share of white is multiplied by this gain, so a raw file and a JPEG of the same metered scene read the same level.
 */
export const RAW_TO_SCENE_GAIN = 0.18 / RAW_MID_GREY_SHARE;

/**
 * A raw channel at or above this share of the white level is clipped: the white balance and colour matrix spread a
 * saturated photosite a little below full scale. common practice, no published source
 */
export const RAW_CLIP_SHARE = 0.98;
