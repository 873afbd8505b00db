/** The phases (products) the transformation model tracks, in a fixed order used for array layouts. */
export const PHASES = ["austenite", "ferrite", "pearlite", "bainite", "martensite"] as const;
export type Phase = (typeof PHASES)[number];
export const AUSTENITE = 0;
export const FERRITE = 1;
export const PEARLITE = 2;
export const BAINITE = 3;
export const MARTENSITE = 4;
export const PHASE_COUNT = 5;
