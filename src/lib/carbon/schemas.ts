import { z } from 'zod';
import {
  CLIMATE_REGIONS,
  CROPLAND_INPUT,
  CROPLAND_SYSTEMS,
  GRASSLAND_INPUT,
  GRASSLAND_MANAGEMENT,
  GWP_SETS,
  SOIL_TYPES,
  TILLAGE,
  type LandUseState,
} from './types';

export { factorSetDocumentSchema } from './factor-set-schema';
export type { FactorSetDocument, FactorTable, FactorEntry, Uncertainty } from './factor-set-schema';

/** Tolerance on the sum of soil fractions (|sum - 1| <= 1e-6). */
export const FRACTION_SUM_TOLERANCE = 1e-6;
/** Largest Monte Carlo run count a request may ask for. */
export const MAX_UNCERTAINTY_RUNS = 20_000;

export const grasslandStateSchema = z.object({
  landUse: z.literal('grassland'),
  management: z.enum(GRASSLAND_MANAGEMENT),
  /** F_I level; `high` only with `improved` management (Table 6.2). */
  input: z.enum(GRASSLAND_INPUT).default('medium'),
});

export const croplandStateSchema = z.object({
  landUse: z.literal('cropland'),
  system: z.enum(CROPLAND_SYSTEMS),
  tillage: z.enum(TILLAGE),
  input: z.enum(CROPLAND_INPUT),
});

export const landUseStateSchema = z.discriminatedUnion('landUse', [grasslandStateSchema, croplandStateSchema]);

export const soilFractionSchema = z.object({
  type: z.enum(SOIL_TYPES),
  /** Share of the area on this soil class, 0 < fraction <= 1. */
  fraction: z.number().gt(0).lte(1),
});

export const uncertaintyRequestSchema = z.object({
  /** Monte Carlo runs (IPCC Approach 2). */
  runs: z.number().int().min(100).max(MAX_UNCERTAINTY_RUNS).default(1000),
  /** PRNG seed: the same seed gives the same range. */
  seed: z
    .number()
    .int()
    .min(0)
    .max(2 ** 31 - 1)
    .default(1),
});

/** Request of `POST /api/estimates` and input of `estimateLandUseChange` (issue 3). */
export const estimateRequestSchema = z
  .object({
    /** Factor set id; when absent the caller picks the authority's default set. */
    factorSet: z.string().min(1).optional(),
    climate: z.enum(CLIMATE_REGIONS),
    soils: z.array(soilFractionSchema).min(1),
    /** Area in hectares, > 0. */
    areaHa: z.number().positive(),
    before: landUseStateSchema,
    after: landUseStateSchema,
    /** Transition period D in years (default 20, 2006 Vol 4 Ch 2 Eq 2.25); also the reporting horizon. */
    transitionYears: z.number().int().min(1).max(100).default(20),
    gwp: z.enum(GWP_SETS).default('ar5'),
    biomass: z.boolean().default(true),
    n2o: z.boolean().default(true),
    uncertainty: uncertaintyRequestSchema.optional(),
  })
  .superRefine((req, ctx) => {
    const sum = req.soils.reduce((s, f) => s + f.fraction, 0);
    if (Math.abs(sum - 1) > FRACTION_SUM_TOLERANCE)
      ctx.addIssue({ code: 'custom', path: ['soils'], message: `Soil fractions must sum to 1 (they sum to ${sum}).` });
    const seen = new Set<string>();
    req.soils.forEach((s, i) => {
      if (seen.has(s.type))
        ctx.addIssue({
          code: 'custom',
          path: ['soils', i, 'type'],
          message: `Soil class "${s.type}" is listed twice; give it one fraction.`,
        });
      seen.add(s.type);
    });
    for (const side of ['before', 'after'] as const) {
      const st: LandUseState = req[side];
      if (st.landUse === 'grassland' && st.input === 'high' && st.management !== 'improved')
        ctx.addIssue({
          code: 'custom',
          path: [side, 'input'],
          message: `High input applies only to improved grassland (IPCC 2006 Vol 4 Ch 6 Table 6.2); ${side} management is "${st.management}".`,
        });
    }
  });

export type EstimateRequestInput = z.input<typeof estimateRequestSchema>;
export type EstimateRequest = z.output<typeof estimateRequestSchema>;

const finite = z.number(); // zod 4 numbers reject NaN and ±Infinity

export const usedFactorSchema = z.object({
  key: z.string(),
  value: finite,
  unit: z.string(),
  source: z.object({
    document: z.string(),
    volume: z.string().optional(),
    chapter: z.string().optional(),
    table: z.string(),
    page: z.string().optional(),
  }),
  status: z.enum(['confirmed', 'unconfirmed']),
  role: z.string(),
});

/** Response of `POST /api/estimates` (200). Carbon in t C, CO2e in t CO2e, N2O in t N2O; positive CO2e = emission. */
export const estimateResultSchema = z.object({
  /** Mineral-soil equilibrium stock before the change, t C/ha of mineral soil (0-30 cm); 0 when no mineral soil. */
  socBeforePerHa: finite,
  /** Mineral-soil equilibrium stock after the change, t C/ha of mineral soil. */
  socAfterPerHa: finite,
  /** Soil carbon change over the area and the D-year horizon, t C (mineral + drained organic); negative = loss. */
  socChangeTotal: finite,
  /** Soil carbon change per year during the transition, t C/yr (= socChangeTotal / D). */
  annualSocChange: finite,
  /** Biomass carbon change at conversion, t C; negative = loss. */
  biomassChangeTotal: finite,
  /** N2O from mineralisation over the transition, t N2O. */
  n2oTotal: finite,
  /** Total over the D-year horizon, t CO2e; positive = emission. Sum of co2eParts. */
  co2eTotal: finite,
  co2eParts: z.object({ soil: finite, biomass: finite, n2o: finite }),
  /** Year 0 = before the change; at least D + 10 years. co2eCumulative in t CO2e. */
  trajectory: z.array(z.object({ year: z.number().int().min(0), socPerHa: finite, co2eCumulative: finite })).min(11),
  factors: z.array(usedFactorSchema),
  factorSet: z.object({ id: z.string(), version: z.number().int() }),
  uncertainty: z
    .object({ co2eLow: finite, co2eHigh: finite, runs: z.number().int(), seed: z.number().int() })
    .optional(),
  cautions: z.array(z.string()).min(3),
});

export type EstimateResult = z.infer<typeof estimateResultSchema>;
