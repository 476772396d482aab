/**
 * The design file, raw form: cover, substrate and layers as thickness plus segments of complex
 * index over one period — the form engineers paste from other calculations. Validated with zod;
 * every message names the field, what is expected and what was found.
 */
import { z } from 'zod';

/** An index: 1.5, "0.22+6.71i", or {n, k}. */
export const IndexSchema = z.union([
  z.number(),
  z.string(),
  z.object({ n: z.number(), k: z.number().default(0) }).strict(),
]);

/** A length: "100 nm" string, or a number in the unit its field name says. */
const LengthText = z.string();

export const SegmentSchema = z
  .object({
    /** fraction of the period, segments in order from x = 0 */
    width: z.number().positive(),
    index: IndexSchema,
  })
  .strict();

export const LayerSchema = z
  .object({
    name: z.string().optional(),
    thickness: LengthText.optional(),
    thicknessNm: z.number().optional(),
    thicknessUm: z.number().optional(),
    /** a uniform film */
    index: IndexSchema.optional(),
    /** a lamellar profile over one period */
    segments: z.array(SegmentSchema).min(1).optional(),
  })
  .strict();

export const IncidenceSchema = z
  .object({
    wavelength: LengthText.optional(),
    wavelengthNm: z.number().optional(),
    wavelengthUm: z.number().optional(),
    angleDeg: z.number().default(0),
    azimuthDeg: z.number().default(0),
    polarization: z
      .union([z.enum(['TE', 'TM']), z.object({ s: z.tuple([z.number(), z.number()]), p: z.tuple([z.number(), z.number()]) }).strict()])
      .optional(),
  })
  .strict();

export const DesignSchema = z
  .object({
    title: z.string().optional(),
    period: LengthText.optional(),
    periodNm: z.number().optional(),
    periodUm: z.number().optional(),
    grooveDensityPerMm: z.number().optional(),
    cover: IndexSchema.default(1),
    substrate: IndexSchema,
    layers: z.array(LayerSchema).default([]),
    incidence: IncidenceSchema,
    orders: z.number().int().min(0).max(1000).default(20),
    factorization: z.enum(['inverse', 'laurent']).default('inverse'),
  })
  .strict();

export type DesignInput = z.input<typeof DesignSchema>;
export type Design = z.output<typeof DesignSchema>;
