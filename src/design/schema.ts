/**
 * The design file: one self-describing JSON document for a grating. Validated with zod (strict
 * objects, so a misspelt field is an error); `designJsonSchema()` exports the same rules as a
 * JSON Schema for editor completion.
 *
 * Lengths are text with a unit ("350 nm", "1.2 um", "0.5 mm") or numbers in a field whose name
 * says the unit (`depthNm`, `thicknessUm`); angles are degrees in fields ending in `Deg`.
 * Materials are a library name ("Al-LD", "fused-silica"), an index (1.5, "0.22+6.71i",
 * {"n": 0.22, "k": 6.71}) or a name defined in `materials`.
 */
import { z } from 'zod';
import { MaterialEntrySchema } from '../materials/index.ts';

/** A material reference: library or user name, or a literal index. */
export const MaterialRefSchema = z.union([z.number(), z.string(), z.strictObject({ n: z.number(), k: z.number().default(0) })]);

const lengthText = z.string();
/** The three spellings of a length field: `name` (text with unit), `nameNm`, `nameUm`. */
function length<N extends string>(name: N): Record<N | `${N}Nm` | `${N}Um`, z.ZodOptional<z.ZodString> | z.ZodOptional<z.ZodNumber>> {
  return { [name]: lengthText.optional(), [`${name}Nm`]: z.number().optional(), [`${name}Um`]: z.number().optional() } as never;
}

const Slicing = z.enum(['uniform', 'adaptive']);

const CoatingSchema = z.strictObject({
  material: MaterialRefSchema,
  ...length('thickness'),
  /** 'conformal': follows the profile; 'filled': fills the grooves up to a flat top */
  mode: z.enum(['conformal', 'filled']).default('conformal'),
});

const gratingCommon = {
  /** ridge material (default: the substrate's) */
  ridge: MaterialRefSchema.optional(),
  /** groove material (default: the cover's) */
  groove: MaterialRefSchema.optional(),
  slices: z.number().int().min(1).max(1000).optional(),
  slicing: Slicing.optional(),
  coating: CoatingSchema.optional(),
};

export const GratingSchema = z.discriminatedUnion('profile', [
  z.strictObject({ profile: z.literal('lamellar'), ...gratingCommon, ...length('depth'), duty: z.number(), offset: z.number().optional(), slantDeg: z.number().optional() }),
  z.strictObject({
    profile: z.literal('trapezoid'),
    ...gratingCommon,
    ...length('depth'),
    ...length('bottomWidth'),
    ...length('topWidth'),
    duty: z.number().optional(),
    sidewallDeg: z.number().optional(),
  }),
  z.strictObject({ profile: z.literal('sawtooth'), ...gratingCommon, blazeDeg: z.number(), apexDeg: z.number().optional() }),
  z.strictObject({ profile: z.literal('triangle'), ...gratingCommon, ...length('depth'), apexDeg: z.number().optional() }),
  z.strictObject({ profile: z.literal('sinusoidal'), ...gratingCommon, ...length('depth') }),
  z.strictObject({ profile: z.literal('multilevel'), ...gratingCommon, steps: z.number().int(), ...length('depth') }),
  z.strictObject({
    profile: z.literal('volume'),
    ...gratingCommon,
    ...length('thickness'),
    deltaN: z.number().optional(),
    deltaEps: z.number().optional(),
    slantDeg: z.number().optional(),
  }),
  z.strictObject({
    profile: z.literal('table'),
    ...gratingCommon,
    /** [x as a fraction of the period, height] pairs; heights in the unit of heightUnit */
    points: z.array(z.tuple([z.number(), z.number()])).min(2),
    heightUnit: z.enum(['nm', 'um']),
  }),
  z.strictObject({
    profile: z.literal('expression'),
    ...gratingCommon,
    /** height as an expression in x (fraction of the period, 0…1), e.g. "60*(1 + sin(2*pi*x))" */
    expression: z.string().min(1),
    heightUnit: z.enum(['nm', 'um']),
  }),
]);

const FilmSchema = z.strictObject({ material: MaterialRefSchema, ...length('thickness'), quarterWaves: z.number().optional() });
export const StackSchema = z.strictObject({
  films: z.array(FilmSchema).min(1),
  repeat: z.number().int().min(1).default(1),
  ...length('designWavelength'),
});

const SegmentSchema = z.strictObject({
  /** fraction of the period; segments follow each other from x = 0 */
  width: z.number().optional(),
  /** or explicit start and end, fractions of the period */
  from: z.number().optional(),
  to: z.number().optional(),
  index: MaterialRefSchema.optional(),
  material: MaterialRefSchema.optional(),
});

export const RawLayerSchema = z.strictObject({
  name: z.string().optional(),
  ...length('thickness'),
  /** a uniform film */
  index: MaterialRefSchema.optional(),
  material: MaterialRefSchema.optional(),
  /** a lamellar profile over one period */
  segments: z.array(SegmentSchema).min(1).optional(),
});

export const IncidenceSchema = z.strictObject({
  ...length('wavelength'),
  angleDeg: z.number().default(0),
  azimuthDeg: z.number().default(0),
  polarization: z.union([z.enum(['TE', 'TM']), z.strictObject({ s: z.tuple([z.number(), z.number()]), p: z.tuple([z.number(), z.number()]) })]).optional(),
});

export const DesignSchema = z.strictObject({
  title: z.string().optional(),
  description: z.string().optional(),
  ...length('period'),
  grooveDensityPerMm: z.number().optional(),
  cover: MaterialRefSchema.default('air'),
  substrate: MaterialRefSchema,
  /** user materials (JSON model entries); they override library entries of the same name */
  materials: z.array(MaterialEntrySchema).optional(),
  /** user materials from CSV tables of wavelength, n, k (file paths relative to the design file) */
  materialTables: z
    .array(z.strictObject({ name: z.string().min(1), file: z.string().min(1), unit: z.string().optional(), citation: z.string().optional() }))
    .optional(),
  /** thin films between the cover and the grating, top first */
  above: StackSchema.optional(),
  grating: GratingSchema.optional(),
  /** thin films between the grating and the substrate, top first */
  below: StackSchema.optional(),
  /** raw layers (thickness plus segments of index), instead of grating/above/below */
  layers: z.array(RawLayerSchema).optional(),
  incidence: IncidenceSchema,
  orders: z.number().int().min(0).max(1000).default(20),
  slices: z.number().int().min(1).max(1000).default(20),
  slicing: Slicing.default('uniform'),
  factorization: z.enum(['inverse', 'laurent']).default('inverse'),
  /** evaluate materials outside their valid range (a warning is carried into the results) */
  allowExtrapolation: z.boolean().default(false),
  /** accept κ < 0 (gain media) */
  allowGain: z.boolean().default(false),
  /** sections read by `furrow sweep`, `furrow optimize` and `furrow tolerance`, which validate them */
  sweep: z.unknown().optional(),
  optimize: z.unknown().optional(),
  tolerance: z.unknown().optional(),
});

export type DesignInput = z.input<typeof DesignSchema>;
export type Design = z.output<typeof DesignSchema>;

/** The design file's rules as a JSON Schema (draft 2020-12) for editor completion. */
export function designJsonSchema(): unknown {
  return z.toJSONSchema(DesignSchema, { io: 'input', unrepresentable: 'any' });
}
