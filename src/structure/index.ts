/**
 * Structure: wavelength-independent geometry of a grating (profiles, slicing, coatings, thin-film
 * stacks, cross-sections) with materials by name, and its conversion to the solver's layers.
 */
export * from './types.ts';
export { StructureError } from './errors.ts';
export { toSolverLayers } from './toSolverLayers.ts';
export { sliceShape, ADAPTIVE_HEIGHT_SHARE, type Slicing } from './slicing.ts';
export { lamellar, type LamellarParams } from './lamellar.ts';
export { volumeGrating, type VolumeGratingParams } from './volume.ts';
export { multiLevel, type MultiLevelParams } from './multilevel.ts';
export { trapezoid, type TrapezoidParams } from './trapezoid.ts';
export { sinusoid, type SinusoidParams } from './sinusoid.ts';
export { sawtooth, type SawtoothParams } from './sawtooth.ts';
export { symmetricTriangle, type TriangleParams } from './triangle.ts';
export { profileFromTable, type TableProfileParams } from './table.ts';
export { profileFromExpression, type ExpressionProfileParams, EXPRESSION_SAMPLES, CROSSING_TOLERANCE } from './expression.ts';
export { conformalCoating, type ConformalCoatingParams } from './coating.ts';
export { filledCoating, type FilledCoatingParams } from './filled.ts';
export { thinFilmStack, type FilmSpec, type ThinFilmStackParams } from './stack.ts';
export { compose, type ComposeParts, type LayerSource } from './compose.ts';
export { crossSection, type CrossSection, type CrossSectionPolygon } from './crossSection.ts';
export { profileOutline, type Outline } from './outline.ts';
export { polylineSurface } from './polyline.ts';
export { mathjs, provideMathjs, mathjsLoaded, type MathModule } from './mathjs-access.ts';
