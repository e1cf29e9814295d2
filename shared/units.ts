/**
 * Unit definitions used everywhere (no imports, so any bundle can use them).
 * International mile: 1609.344 m exactly (1959 international yard and pound agreement).
 * Marathon 42 195 m and half marathon 21 097.5 m (World Athletics road race distances).
 */
export const METRES_PER_MILE = 1609.344;
export const METRES_PER_KM = 1000;
export const MARATHON_M = 42_195;
export const HALF_MARATHON_M = 21_097.5;
