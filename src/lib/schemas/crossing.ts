import { z } from 'zod';

export const CROSSING_STYLES = ['continuous-floodgate', 'drop-down-section'] as const;
/** Each crossing style's name wherever a person reads it (pages, e-mails, sheets). */
export const CROSSING_STYLE_NAMES: Record<(typeof CROSSING_STYLES)[number], string> = {
  'continuous-floodgate': 'Continuous swinging floodgate',
  'drop-down-section': 'Separate drop-down section',
};
/** The name of a stored style, or the style itself when it is one this build does not know. */
export const crossingStyleName = (style: string): string => CROSSING_STYLE_NAMES[style as (typeof CROSSING_STYLES)[number]] ?? style;
export const TC_METHODS = ['bransby-williams', 'pilgrim-mcdermott', 'kirpich'] as const;
/** How much timber and grass a flood is expected to carry down to the crossing. */
export const DEBRIS_LEVELS = ['light', 'moderate', 'heavy'] as const;
export type DebrisLevel = (typeof DEBRIS_LEVELS)[number];
const debrisMessage = { errorMap: () => ({ message: "Expected debris is 'light', 'moderate' or 'heavy'." }) };

/** What a person sets for one crossing; every field optional (the property's settings fill the rest). */
export const crossingInputsSchema = z
  .object({
    floodMarkM: z.number().positive('A flood mark is a height above the channel bed, more than 0 m.').max(30, 'A flood mark over 30 m is not plausible for a fence crossing.').nullable(),
    channelN: z.number().min(0.01, "Manning's n below 0.01 is smoother than glass; natural channels are 0.025–0.15.").max(0.3, "Manning's n above 0.3 is beyond Chow's tables."),
    overbankN: z.number().min(0.01, "Manning's n below 0.01 is smoother than glass.").max(0.3, "Manning's n above 0.3 is beyond Chow's tables."),
    runoffCoefficient: z.number().gt(0, 'A runoff coefficient is more than 0.').max(1, 'A runoff coefficient above 1 means more water runs off than falls; use 0–1.'),
    aepPercent: z.number().positive('AEP is a percentage above 0.').max(99, 'AEP is a percentage below 100.'),
    tcMethod: z.enum(TC_METHODS),
    freeboardM: z.number().min(0, 'Freeboard cannot be negative.').max(3, 'Keep freeboard under 3 m.'),
    style: z.enum(CROSSING_STYLES, { errorMap: () => ({ message: "The style is 'continuous-floodgate' or 'drop-down-section'." }) }),
    debris: z.enum(DEBRIS_LEVELS, debrisMessage),
  })
  .partial()
  .strict();
export type CrossingInputs = z.infer<typeof crossingInputsSchema>;

/** Property-wide design settings; each has a default stated in the README and on the settings page. */
export const designSettingsSchema = z
  .object({
    goodWithinDeg: z.number().min(1).max(60),
    fairWithinDeg: z.number().min(2).max(89),
    strainerSetbackM: z.number().min(0).max(100),
    floodgatePostSpacingM: z.number().min(1).max(20),
    braceDepthM: z.number().min(0).max(10),
    braceVelocityMs: z.number().min(0).max(10),
    minEmbedmentM: z.number().min(0.3).max(5),
    preferredEmbedmentM: z.number().min(0.3).max(5),
    freeboardM: z.number().min(0).max(3),
    channelN: z.number().min(0.01).max(0.3),
    overbankN: z.number().min(0.01).max(0.3),
    runoffCoefficient: z.number().gt(0).max(1),
    aepPercent: z.number().positive().max(99),
    tcMethod: z.enum(TC_METHODS),
    blockageFraction: z.number().min(0).max(1),
    pretensionN: z.number().min(0).max(20_000),
    safeFractionOfBreaking: z.number().gt(0).max(1),
    profileHalfWidthM: z.number().min(20).max(2000),
    labourRatePerDayCents: z.number().int().min(0),
    metresPerDay: z.number().positive().max(10_000),
    debris: z.enum(DEBRIS_LEVELS, debrisMessage),
    dropDownWidthM: z.number().min(1).max(1000),
    dropDownDepthM: z.number().min(0.05).max(20),
    dropDownVelocityMs: z.number().min(0.05).max(20),
    dropDownDebris: z.enum(['moderate', 'heavy']),
    sectionReleaseKn: z.number().min(0.05).max(100),
    resetTieHours: z.number().min(0).max(200),
    rehangSectionHours: z.number().min(0).max(200),
  })
  .partial()
  .strict()
  .refine((s) => s.goodWithinDeg === undefined || s.fairWithinDeg === undefined || s.goodWithinDeg < s.fairWithinDeg, {
    message: 'The "good" tolerance must be tighter than the "fair" one.',
    path: ['fairWithinDeg'],
  });
export type DesignSettings = z.infer<typeof designSettingsSchema>;

/**
 * Defaults of the design settings. Tolerances are the (20° good, 45° fair); the crossing
 * defaults are DESIGN.md's rules of thumb (common practice, no published source); the pretension
 * is the usual straining of 12½-gauge high-tensile wire, about 1.1 kN (University of Florida IFAS
 * Extension circular 851); n and C are Chow (1959) Table 5-6 and a pasture coefficient (see
 * the hydraulics core); the 5 % AEP and Bransby-Williams are our choices for a screening flood.
 */
export const DEFAULT_DESIGN_SETTINGS: Required<DesignSettings> = Object.freeze({
  goodWithinDeg: 20,
  fairWithinDeg: 45,
  strainerSetbackM: 15,
  floodgatePostSpacingM: 4,
  braceDepthM: 0.5,
  braceVelocityMs: 1.0,
  minEmbedmentM: 1.2,
  preferredEmbedmentM: 1.5,
  freeboardM: 0.3,
  channelN: 0.04,
  overbankN: 0.035,
  runoffCoefficient: 0.3,
  aepPercent: 5,
  tcMethod: 'bransby-williams',
  blockageFraction: 0.5,
  pretensionN: 1100,
  safeFractionOfBreaking: 0.5,
  profileHalfWidthM: 150,
  labourRatePerDayCents: 60_000,
  metresPerDay: 400,
  // The style rule and the after-flood work (see choose-style.ts and compare-styles.ts): common
  // practice and judgement, no published source; the drop-down section itself is NSW DPI
  // Primefact 681 (2009) and WA Water Note WN19 (2000).
  debris: 'moderate',
  dropDownWidthM: 30,
  dropDownDepthM: 1.2,
  dropDownVelocityMs: 1.5,
  dropDownDebris: 'heavy',
  sectionReleaseKn: 1.5,
  resetTieHours: 0.5,
  rehangSectionHours: 3,
});

export const ifdTableSchema = z.object({
  aepPercent: z.array(z.number().positive().max(99)).min(1).max(20),
  durationsMin: z.array(z.number().positive().max(10_080)).min(2).max(40),
  intensitiesMmH: z.array(z.array(z.number().positive().max(2000))).min(1).max(20),
  source: z.string().trim().max(300).default(''),
});
export type IfdTableInput = z.infer<typeof ifdTableSchema>;
