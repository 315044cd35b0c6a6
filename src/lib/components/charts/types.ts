/** One sample of the NPV profile; `rate` is a fraction (0.25 = 25%) per period or per year. */
export type ProfilePoint = { rate: number; npv: number };

/** A root and its certificate interval [low, high], all fractions in the same unit as the profile. */
export type CertifiedRoot = { rate: number; low: number; high: number };

/** One method's bracket widths (fractions of a rate); widths[0] is the starting bracket. */
export type MethodSeries = { label: string; widths: number[] };
