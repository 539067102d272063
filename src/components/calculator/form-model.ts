/**
 * The calculator form's own model (soil shares in percent, flat fields for the two land uses)
 * and its conversion to the API body. The server validates the body again.
 */
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
} from '~/lib/carbon';

const landUse = z.object({
  landUse: z.enum(['grassland', 'cropland']),
  management: z.enum(GRASSLAND_MANAGEMENT),
  grassInput: z.enum(GRASSLAND_INPUT),
  system: z.enum(CROPLAND_SYSTEMS),
  tillage: z.enum(TILLAGE),
  cropInput: z.enum(CROPLAND_INPUT),
});

export const calculatorFormSchema = z
  .object({
    factorSet: z.string().min(1),
    climate: z.enum(CLIMATE_REGIONS),
    soils: z
      .array(
        z.object({
          type: z.enum(SOIL_TYPES),
          percent: z.coerce.number<number>().gt(0, 'More than 0%.').lte(100, 'At most 100%.'),
        }),
      )
      .min(1),
    areaHa: z.coerce.number<number>().positive('Give an area above 0 ha.').max(1_000_000),
    before: landUse,
    after: landUse,
    transitionYears: z.coerce.number<number>().int().min(1).max(100),
    gwp: z.enum(GWP_SETS),
    biomass: z.boolean(),
    n2o: z.boolean(),
    withUncertainty: z.boolean(),
    runs: z.coerce.number<number>().int().min(100).max(20000),
    seed: z.coerce
      .number<number>()
      .int()
      .min(0)
      .max(2 ** 31 - 1),
  })
  .superRefine((v, ctx) => {
    const sum = v.soils.reduce((s, x) => s + x.percent, 0);
    if (Math.abs(sum - 100) > 1e-4)
      ctx.addIssue({ code: 'custom', path: ['soils'], message: `Soil shares must add up to 100% (now ${sum}%).` });
    for (const side of ['before', 'after'] as const) {
      const s = v[side];
      if (s.landUse === 'grassland' && s.grassInput === 'high' && s.management !== 'improved')
        ctx.addIssue({
          code: 'custom',
          path: [side, 'grassInput'],
          message: 'High input applies only to improved grassland.',
        });
    }
  });

export type CalculatorForm = z.input<typeof calculatorFormSchema>;
export type CalculatorValues = z.output<typeof calculatorFormSchema>;

export const DEFAULT_FORM: CalculatorForm = {
  factorSet: 'ipcc-2006',
  climate: 'cool-temperate-moist',
  soils: [{ type: 'hac', percent: 100 }],
  areaHa: 10,
  before: {
    landUse: 'grassland',
    management: 'nominal',
    grassInput: 'medium',
    system: 'long-term-cultivated',
    tillage: 'full',
    cropInput: 'medium',
  },
  after: {
    landUse: 'cropland',
    management: 'nominal',
    grassInput: 'medium',
    system: 'long-term-cultivated',
    tillage: 'full',
    cropInput: 'medium',
  },
  transitionYears: 20,
  gwp: 'ar5',
  biomass: true,
  n2o: true,
  withUncertainty: true,
  runs: 1000,
  seed: 1,
};

function state(s: CalculatorValues['before']) {
  return s.landUse === 'grassland'
    ? { landUse: 'grassland' as const, management: s.management, input: s.grassInput }
    : { landUse: 'cropland' as const, system: s.system, tillage: s.tillage, input: s.cropInput };
}

export function toRequestBody(v: CalculatorValues) {
  return {
    factorSet: v.factorSet,
    climate: v.climate,
    soils: v.soils.map((s) => ({ type: s.type, fraction: s.percent / 100 })),
    areaHa: v.areaHa,
    before: state(v.before),
    after: state(v.after),
    transitionYears: v.transitionYears,
    gwp: v.gwp,
    biomass: v.biomass,
    n2o: v.n2o,
    ...(v.withUncertainty ? { uncertainty: { runs: v.runs, seed: v.seed } } : {}),
  };
}
