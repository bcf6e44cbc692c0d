export { COMPONENT_SERIAL_MAX, EARLIEST_SALE_DATE, FRAME_SERIAL_LENGTH, REGISTRY_COLUMNS, REGISTRY_LIMITS, SERIAL_PATTERN, sampleRegistryCsv, type RegistryColumn } from './layout';
export { formatComponentList, parseComponentList, type ComponentListResult } from './components';
export { parseRegistryCsv, type ParsedRegistryFile, type RawRegistryRow } from './parse-csv';
export { checkRegistryRows, type CheckedRegistryRow, type RegistryCheck, type RegistryCheckContext, type RegistryProblem, type RegistryUnitInput } from './check-rows';
