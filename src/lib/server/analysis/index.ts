// Reading a frame: Exif settings, measured light and colour, display copies. Server only; no database.
export { readFrame, tryReadFrame, type Frame, type PixelReport, type ReadFrameOptions, type ReadFrameResult } from './read-frame';
export { displayCopies, DISPLAY_SIZE, THUMBNAIL_SIZE, type DisplayCopies, type DisplayCopy } from './display';
export { FrameReadError, isFrameReadError, type FrameErrorCode } from './errors';
export { EXIF_TAG_NAMES, type ExifField, type ExifReport } from './exif';
export { decodeFlash, describeFlash, type FlashInfo, type FlashMode, type FlashReturnLight } from './flash';
export { checkBox, parseBox, DEFAULT_SUBJECT_BOX, type Box } from './region';
export { MID_GREY, CLIP_CODE, CRUSH_CODE, stopsFromMidGrey, type RegionStats, type LinearRgb } from './pixels';
export { decodeGrid, cellPlaces, GRID_CELLS_LONG_SIDE, type Cells, type CellPlace, type LightGrid } from './light-grid';
export { ANALYSIS_SIZE, analysisSizeFor, DEFAULT_LIMITS, type InputLimits } from './decode';
export { detectFileType, type FileKind, type FileType } from './detect';
