/**
 * The cautions every report and notebook shows. A prediction that overstates strength could let a
 * weaker part into service, so these are never optional.
 */
export const CAUTIONS: readonly string[] = [
  'These are planning estimates from a fitted hardening law, isotropic hardening and idealised strain paths; they are not test results.',
  'Confirm strength, remaining ductility and springback by tests on the real material, heat and route before release.',
  'Properties past the tensile test\'s uniform strain are extrapolated; laws that fit a test equally well can differ widely there.',
  'Reversed loading (straightening, reverse bending) yields earlier than an isotropic ledger predicts (Bauschinger effect).',
  'Hardness (HV) is estimated from the flow curve by Tabor\'s relation, typically no closer than 10–15 %; converted HB, HRB, HRC and Rm are approximate and given only inside a published table\'s range. Release parts by measured hardness (ISO 6507-1 / ASTM E92).',
  'Follow the applicable codes and standards and licensed engineering judgment; this tool does not replace them.',
];

/**
 * Shown besides {@link CAUTIONS} when the steps are named in a temper system: the temper comes from
 * the predicted state, not from a measurement, and some table values behind it are from memory.
 */
export const TEMPER_CAUTION = 'Tempers are named from the predicted state, not measured; release material by the hardness or tensile values its product standard requires, measured on the part.';
