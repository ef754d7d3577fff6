/**
 * The caution every output of the live engine carries (physics.md, "Cautions that every output
 * carries"), word for word.
 */
export const CAUTION_TEXT =
  'Estimates only: a model fed by a few sensors. Decisions on curing, protection, stripping and ' +
  'loading stay with the project specifications, local codes and the responsible licensed ' +
  'engineer; confirm strength with field-cured specimens or in-place tests as the ' +
  'specifications require.';
