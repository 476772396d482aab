/**
 * JSON model entries for users' own materials, validated with zod. The design file embeds
 * {@link MaterialEntrySchema}; {@link materialFromEntry} turns a validated entry into a material.
 *
 * Common fields: `name` (no ':'), `model`, `citation` (optional), `notes` (optional),
 * `fromMemory` (optional), and `rangeUm: [min, max]` (µm; required except for 'constant', where
 * it defaults to every wavelength, and 'table', where it defaults to the table's span).
 *
 * | model | fields (units in the names) |
 * |---|---|
 * | constant | n, k (default 0) |
 * | sellmeier | A (default 1), B[], CUm[] (µm) or C2Um2[] (µm²): n² = A + Σ B·λ²/(λ² − C²) |
 * | cauchy | A, BUm2, CUm4, absorption {A, BUm2, CUm4}: n = A + B/λ² + C/λ⁴, κ likewise |
 * | drude | epsInf (default 1), plasmaEv, dampingEv: ε = ε∞ − ωp²/(ω(ω + iγ)) |
 * | lorentz-drude | plasmaEv, f0, gamma0Ev, oscillators [{f, gammaEv, omegaEv}] |
 * | table | wavelengthUm[] or wavelengthNm[], n[], k[] (optional) |
 */
import { z } from 'zod';

const Name = z
  .string()
  .min(1, 'name must not be empty')
  .refine((s) => s.trim() === s && !s.includes(':'), 'name must have no surrounding spaces and no ":" (reserved for the :o / :e axes of uniaxial crystals)');
const Range = z.tuple([z.number().nonnegative(), z.number().positive()], {
  error: (issue) => (issue.input === undefined ? 'required: the valid range [min, max] in µm' : 'expected [min, max] in µm'),
});
const Num = z.number();
const common = {
  name: Name,
  citation: z.string().optional(),
  notes: z.array(z.string()).optional(),
  fromMemory: z.boolean().optional(),
};

const Constant = z.strictObject({ ...common, model: z.literal('constant'), n: z.number().nonnegative(), k: z.number().nonnegative().default(0), rangeUm: Range.optional() });
const Sellmeier = z.strictObject({
  ...common,
  model: z.literal('sellmeier'),
  A: Num.optional(),
  B: z.array(Num).min(1),
  CUm: z.array(Num).min(1).optional(),
  C2Um2: z.array(z.number().nonnegative()).min(1).optional(),
  rangeUm: Range,
});
const CauchyTerms = z.strictObject({ A: Num, BUm2: Num.optional(), CUm4: Num.optional() });
const Cauchy = z.strictObject({ ...common, model: z.literal('cauchy'), A: Num, BUm2: Num.optional(), CUm4: Num.optional(), absorption: CauchyTerms.optional(), rangeUm: Range });
const Drude = z.strictObject({ ...common, model: z.literal('drude'), epsInf: Num.optional(), plasmaEv: z.number().positive(), dampingEv: z.number().nonnegative(), rangeUm: Range });
const LorentzDrude = z.strictObject({
  ...common,
  model: z.literal('lorentz-drude'),
  plasmaEv: z.number().positive(),
  f0: z.number().nonnegative(),
  gamma0Ev: z.number().nonnegative(),
  oscillators: z.array(z.strictObject({ f: z.number().nonnegative(), gammaEv: z.number().nonnegative(), omegaEv: z.number().nonnegative() })),
  rangeUm: Range,
});
const Table = z.strictObject({
  ...common,
  model: z.literal('table'),
  wavelengthUm: z.array(Num).optional(),
  wavelengthNm: z.array(Num).optional(),
  n: z.array(Num),
  k: z.array(Num).optional(),
  rangeUm: Range.optional(),
});

/**
 * zod schema of one user material entry (see the module comment for the fields).
 * @example
 * MaterialEntrySchema.parse({ name: 'my-film', model: 'cauchy', A: 1.5, BUm2: 0.004, rangeUm: [0.4, 1.0] });
 */
export const MaterialEntrySchema = z
  .discriminatedUnion('model', [Constant, Sellmeier, Cauchy, Drude, LorentzDrude, Table])
  .superRefine((e, ctx) => {
    if (e.rangeUm && !(e.rangeUm[1] > e.rangeUm[0])) ctx.addIssue({ code: 'custom', path: ['rangeUm'], message: `range must be [min, max] with min < max, found [${e.rangeUm.join(', ')}]` });
    if (e.model === 'sellmeier' && (e.CUm === undefined) === (e.C2Um2 === undefined)) {
      ctx.addIssue({ code: 'custom', path: ['CUm'], message: 'give exactly one of CUm (resonance wavelengths, µm) or C2Um2 (their squares, µm²)' });
    }
    if (e.model === 'table' && (e.wavelengthUm === undefined) === (e.wavelengthNm === undefined)) {
      ctx.addIssue({ code: 'custom', path: ['wavelengthUm'], message: 'give exactly one of wavelengthUm or wavelengthNm' });
    }
  });

/** A user material entry as written in JSON (before defaults). */
export type MaterialEntry = z.input<typeof MaterialEntrySchema>;

/** The model names a JSON entry may use. */
export const MATERIAL_ENTRY_MODELS = ['constant', 'sellmeier', 'cauchy', 'drude', 'lorentz-drude', 'table'] as const;
