// Exact unit constants used by every conversion (sources in shared/TRADE_FACTS.md, §3).

/** Grams in one avoirdupois pound, exact by definition (international yard and pound, 1959). */
export const GRAMS_PER_POUND = 453.59237;
/** Square feet in one acre, exact (USU; AH697). */
export const SQUARE_FEET_PER_ACRE = 43_560;
/** Metres in one international foot, exact. */
export const METRES_PER_FOOT = 0.3048;
export const SQUARE_METRES_PER_HECTARE = 10_000;
export const INCHES_PER_FOOT = 12;
/** 10.7639… ft² per m² (derived from the exact foot). */
export const SQUARE_FEET_PER_SQUARE_METRE = 1 / (METRES_PER_FOOT * METRES_PER_FOOT);
/** 2.47105… acres per hectare (derived). */
export const ACRES_PER_HECTARE =
  (SQUARE_METRES_PER_HECTARE * SQUARE_FEET_PER_SQUARE_METRE) / SQUARE_FEET_PER_ACRE;
/** 1.12085 kg/ha per lb/ac (derived; USU rounds to 1.12). */
export const KG_PER_HA_PER_LB_PER_ACRE = (GRAMS_PER_POUND / 1000) * ACRES_PER_HECTARE;
/** Kilograms in one tonne (megagram), exact (SI; NIST SP 811, 2008, Appendix B.8). */
export const KILOGRAMS_PER_TONNE = 1000;
