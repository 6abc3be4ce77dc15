export { analyseImage } from './analyse';
export { CLUSTER_RULE } from './choose-clusters';
export { PIXEL_LIMITS, type PixelImage } from './pixels';
export { AnalysisInputError, clipRegion, scaleRegion, wholeImage, type Size } from './regions';
export * from './schemas';
export { GLINT_BAND, shrinkRejectingGlare, sourceOfCells, type ShrinkPart } from './shrink';
