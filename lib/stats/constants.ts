/** [std] ASTM E2587 / NIST e-Handbook control chart constants for moving ranges of two (n = 2). */
export const D2_N2 = 1.128;
export const D4_N2 = 3.267;
