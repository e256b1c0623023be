/** Metres per length unit: the one place the foot is defined, for grids in feet and for feet on screen. */

/** The international foot, exactly 0.3048 m (international yard and pound agreement, 1959). */
export const METRES_PER_FOOT = 0.3048;

/** The US survey foot, 1200/3937 m (NIST SP 811 appendix B). */
export const METRES_PER_US_SURVEY_FOOT = 1200 / 3937;
