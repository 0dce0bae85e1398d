/** The cautions every report carries (docs/contracts.md, "Cautions"). */
export const CAUTIONS: readonly string[] = [
  "These are model estimates from a gate-level timing model, not a sign-off. Confirm with transistor-level simulation using the foundry's device models, and validate on silicon.",
  'A generator that lets two switches conduct together can short a supply or a high-voltage node and overheat or destroy a part; high-voltage charge pumps can injure.',
  "Local codes, the foundry's design rules and licensed engineering practice come first.",
];
