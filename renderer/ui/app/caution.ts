/** The standing caution under every workspace (DESIGN.md, "Quality bar"). */
export const CAUTION_TEXT =
  "Review every mark against your institution's grading policy before submitting. Exported files contain identifiable student data.";
