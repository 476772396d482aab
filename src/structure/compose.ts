/**
 * Assemble a structure's layers: [stack above] + [grating (profile, coated or not)] +
 * [stack below], top (cover side) first.
 */
import type { GeometryLayer, ProfileResult, StackResult } from './types.ts';
import { fail } from './validate.ts';

export type LayerSource = ReadonlyArray<GeometryLayer> | ProfileResult | StackResult;

export interface ComposeParts {
  /** films between the cover and the grating */
  readonly above?: LayerSource;
  /** the grating region */
  readonly grating?: LayerSource;
  /** films between the grating and the substrate */
  readonly below?: LayerSource;
}

/**
 * Concatenate the parts, top first.
 * @param parts stacks and grating (each a layer list or a builder's result)
 * @returns one layer list; the grating's top lies at the total thickness of `above` (µm)
 * @throws {StructureError} when a part is neither a layer list nor a result with `layers`
 * @example
 * compose({ above: thinFilmStack({ films: [{ material: 'SiO2', thicknessUm: 0.1 }] }),
 *           grating: lamellar({ periodUm: 1, duty: 0.5, depthUm: 0.2, ridgeMaterial: 'Si', grooveMaterial: 'air' }) });
 */
export function compose(parts: ComposeParts): GeometryLayer[] {
  if (typeof parts !== 'object' || parts === null) fail('compose', 'an object {above?, grating?, below?}', parts);
  const out: GeometryLayer[] = [];
  for (const key of ['above', 'grating', 'below'] as const) {
    const src = parts[key];
    if (src === undefined) continue;
    const list = Array.isArray(src) ? src : (src as { layers?: unknown }).layers;
    if (!Array.isArray(list)) fail(`compose.${key}`, 'a layer list or a result with layers', src);
    out.push(...(list as GeometryLayer[]));
  }
  return out;
}
