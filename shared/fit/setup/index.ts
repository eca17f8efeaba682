/** The setup a plan moves: parameters, units, groups, schemas, date arithmetic and the saddle compensation. */
export {
  COUPLED_GROUPS,
  GROUP_LABELS,
  GROUP_PARAMETERS,
  groupOf,
  PARAMETER_GROUPS,
  PARAMETER_INFO,
  SETUP_PARAMETERS,
  type ParameterGroup,
  type ParameterInfo,
  type SetupParameter,
} from './parameters';
export { isoDateSchema, setupParameterSchema, setupSchema, type IsoDate, type Setup } from './schemas';
export { addDays, daysBetween } from './dates';
export { couplingCompensation, saddleOffsetFromReference } from './coupling';
