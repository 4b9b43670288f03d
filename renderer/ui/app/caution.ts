/** The standing cautions (DESIGN.md, "Quality bar"): one wording, used wherever marks are shown. */
export const REVIEW_CAUTION = "Review every mark against your institution's grading policy before submitting.";
export const DATA_CAUTION = 'Exported files contain identifiable student data.';

/** Under every workspace. */
export const CAUTION_TEXT = `${REVIEW_CAUTION} ${DATA_CAUTION}`;
