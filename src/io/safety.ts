/** The caution that the README, every summary file and every report carry. */
export const SAFETY_NOTICE =
  "Results are engineering estimates from a model, to be confirmed by plant trials before use. " +
  "Hot steel and high-pressure water can injure people; local codes, plant safety rules and licensed engineering practice govern every decision.";
