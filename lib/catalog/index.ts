export { CATEGORY_NAMES, DYNO_CATEGORIES, LEGAL_CLASS_IDS, LEGAL_CLASS_LABELS, type LegalClassCode } from './labels';
export {
  MASS_INPUT_UNITS, POWER_INPUT_UNITS, STORED_DECIMALS, TORQUE_INPUT_UNITS, batteryEnergy, defaultInputUnits, describeSpec, describeWeight,
  inputUnitLabel, specInputValue, specToSi, type BatteryEnergy, type MassInputUnit, type PowerInputUnit, type TorqueInputUnit,
} from './spec';
