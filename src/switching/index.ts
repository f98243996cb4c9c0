export type { KitPole, KitPosition, SwitchDefinition, SwitchKit } from './switch-kit.js';
export {
  MAX_KIT_POSITIONS,
  countKitPositions,
  describeKitPosition,
  enumerateKitPoles,
  enumerateKitPositions,
  poleLetter,
  withMorePoles,
  withSwitch,
} from './switch-kit.js';
export { MAX_POLES, MAX_POSITIONS, PRESET_NAMES_TEXT, parsePresetSwitch, presetSwitch } from './switch-presets.js';
export { MAX_SWITCHES, parseSwitchText, parseSwitchTexts, parseSwitchingSection } from './parse-switching.js';
export type { CoilLead } from './element-terminals.js';
export { GROUND_ITEM, HOT_ITEM, circuitOfComponents, coilLeadOf, describeItem, itemCount, minusItem, plusItem } from './element-terminals.js';
export type { TargetPartitions } from './target-partitions.js';
export { enumerateTargetPartitions } from './target-partitions.js';
export type { PositionReading } from './read-position-wiring.js';
export { readPositionWiring } from './read-position-wiring.js';
export type { KitLugLayout, PositionWish, SwitchPlan, SwitchPlanOptions, SwitchPlanResult } from './solve-switch-plan.js';
export { DEFAULT_SWITCH_PLAN_OPTIONS, kitLugLayout, solveSwitchPlan } from './solve-switch-plan.js';
export type { PlanPosition } from './plan-positions.js';
export { componentsAt, readPlanPositions } from './plan-positions.js';
export type { PositionVerification } from './verify-switch-plan.js';
export { verifySwitchPlan, VERIFY_POINTS, VERIFY_TOLERANCE_DB, VERIFY_TOLERANCE_DEG, UNUSED_RELATIVE_LIMIT } from './verify-switch-plan.js';
export type { HardwareChange, SwitchRequestResult, UnreachablePosition } from './solve-switch-request.js';
export { solveSwitchRequest } from './solve-switch-request.js';
export type { PlanDescription, PlanLug, PlanNet } from './describe-plan.js';
export { describePlan } from './describe-plan.js';
export { escapeXml, renderSwitchDrawing } from './render-switch-drawing.js';
export { describeKit, describeReading, describeWish, expectedReading, renderSwitchSheet } from './render-switch-sheet.js';
export type { ChoiceWiring, SwitchChoice, SwitchChoiceRequest } from './solve-switch-choice.js';
export { solveSwitchChoice } from './solve-switch-choice.js';
export type { ChoiceWirings } from './measure-choice-wirings.js';
export { measureChoiceWirings } from './measure-choice-wirings.js';
