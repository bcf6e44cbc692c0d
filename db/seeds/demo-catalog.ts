// The invented catalogs of the two demo brands. Specs, prices and hours are demo figures.
type Category = 'drive_unit' | 'battery' | 'controller' | 'display' | 'charger' | 'frame' | 'other';

export const demoModels: Record<string, { code: string; name: string; year: number; legalClass: string; tyre: string }[]> = {
  torvane: [
    { code: 'KST-T', name: 'Kestrel Trek 625', year: 2025, legalClass: 'eu_pedelec', tyre: '50-622' },
    { code: 'KST-U', name: 'Kestrel Urban US', year: 2025, legalClass: 'us_class1', tyre: '47-622' },
    { code: 'HRR-C', name: 'Harrier Cargo', year: 2024, legalClass: 'eu_pedelec', tyre: '55-406' },
    { code: 'SWF-S', name: 'Swift Commuter S', year: 2025, legalClass: 'us_class3', tyre: '57-622' },
  ],
  wrenfield: [
    { code: 'LRK-TR', name: 'Larkspur Trail', year: 2025, legalClass: 'us_class1', tyre: '60-584' },
    { code: 'QRY-CT', name: 'Quarry City', year: 2025, legalClass: 'us_class2', tyre: '50-584' },
    { code: 'LMD-TO', name: 'Longmeadow Tour', year: 2024, legalClass: 'us_class3', tyre: '55-622' },
    { code: 'QRY-EU', name: 'Quarry City EU', year: 2025, legalClass: 'eu_pedelec', tyre: '50-584' },
  ],
};

export type DemoPart = {
  partNumber: string;
  name: string;
  category: Category;
  minWheelPowerW?: number;
  minWheelTorqueNm?: number;
  ratedCapacityAh?: number;
  nominalVoltageV?: number;
  weightKg: number;
  unitCostMinor: number;
  netPriceMinor: number;
};

export const demoParts: Record<string, DemoPart[]> = {
  torvane: [
    { partNumber: 'TV-DU85', name: 'Drive unit DU85 (mid motor)', category: 'drive_unit', minWheelPowerW: 300, minWheelTorqueNm: 24, weightKg: 3.2, unitCostMinor: 41000, netPriceMinor: 54900 },
    { partNumber: 'TV-DU60', name: 'Drive unit DU60 (mid motor, light)', category: 'drive_unit', minWheelPowerW: 250, minWheelTorqueNm: 18, weightKg: 2.6, unitCostMinor: 32000, netPriceMinor: 43900 },
    { partNumber: 'TV-BP625', name: 'Frame battery BP625, 36 V 17.4 Ah', category: 'battery', ratedCapacityAh: 17.4, nominalVoltageV: 36, weightKg: 3.5, unitCostMinor: 38000, netPriceMinor: 51900 },
    { partNumber: 'TV-BP500', name: 'Frame battery BP500, 36 V 13.9 Ah', category: 'battery', ratedCapacityAh: 13.9, nominalVoltageV: 36, weightKg: 2.9, unitCostMinor: 31000, netPriceMinor: 42900 },
    { partNumber: 'TV-CT20', name: 'Motor controller CT20', category: 'controller', weightKg: 0.4, unitCostMinor: 9000, netPriceMinor: 12900 },
    { partNumber: 'TV-DPC2', name: 'Colour display C2 with remote', category: 'display', weightKg: 0.2, unitCostMinor: 11000, netPriceMinor: 15900 },
    { partNumber: 'TV-CH4', name: 'Charger 4 A', category: 'charger', weightKg: 0.9, unitCostMinor: 5200, netPriceMinor: 7900 },
  ],
  wrenfield: [
    { partNumber: 'WF-HM750', name: 'Rear hub motor 750 W', category: 'drive_unit', minWheelPowerW: 550, minWheelTorqueNm: 35, weightKg: 4.8, unitCostMinor: 26000, netPriceMinor: 36500 },
    { partNumber: 'WF-HM500', name: 'Rear hub motor 500 W', category: 'drive_unit', minWheelPowerW: 380, minWheelTorqueNm: 26, weightKg: 4.1, unitCostMinor: 21000, netPriceMinor: 29500 },
    { partNumber: 'WF-B4814', name: 'Downtube battery 48 V 14 Ah', category: 'battery', ratedCapacityAh: 14, nominalVoltageV: 48, weightKg: 3.6, unitCostMinor: 34000, netPriceMinor: 47500 },
    { partNumber: 'WF-B3610', name: 'Rack battery 36 V 10 Ah', category: 'battery', ratedCapacityAh: 10, nominalVoltageV: 36, weightKg: 2.7, unitCostMinor: 24000, netPriceMinor: 33500 },
    { partNumber: 'WF-RX26', name: 'Range extender cell pack 36 V 2.6 Ah', category: 'battery', ratedCapacityAh: 2.6, nominalVoltageV: 36, weightKg: 0.7, unitCostMinor: 9000, netPriceMinor: 12500 },
    { partNumber: 'WF-CTL48', name: 'Controller 48 V sine-wave', category: 'controller', weightKg: 0.5, unitCostMinor: 7500, netPriceMinor: 10900 },
    { partNumber: 'WF-LCD3', name: 'Handlebar display LCD3', category: 'display', weightKg: 0.2, unitCostMinor: 4800, netPriceMinor: 6900 },
    { partNumber: 'WF-FRM-LRK', name: 'Larkspur Trail frame, size M', category: 'frame', weightKg: 3.1, unitCostMinor: 38000, netPriceMinor: 52000 },
  ],
};

export const demoPolicies: Record<string, { category: Category; months: number; cycles?: number; capacityPct?: number; coreDays: number; reviewDays: number; appealDays: number; exclusions: string[] }[]> = {
  torvane: [
    { category: 'drive_unit', months: 24, coreDays: 15, reviewDays: 5, appealDays: 30, exclusions: ['crash_damage', 'water_ingress', 'modification'] },
    { category: 'battery', months: 24, cycles: 800, capacityPct: 70, coreDays: 15, reviewDays: 5, appealDays: 30, exclusions: ['crash_damage', 'water_ingress', 'modification'] },
    { category: 'controller', months: 24, coreDays: 15, reviewDays: 5, appealDays: 30, exclusions: ['water_ingress', 'modification'] },
    { category: 'display', months: 24, coreDays: 15, reviewDays: 5, appealDays: 30, exclusions: ['crash_damage'] },
    { category: 'charger', months: 12, coreDays: 10, reviewDays: 5, appealDays: 30, exclusions: [] },
    { category: 'other', months: 12, coreDays: 10, reviewDays: 5, appealDays: 30, exclusions: ['wear_item'] },
  ],
  wrenfield: [
    { category: 'drive_unit', months: 24, coreDays: 20, reviewDays: 4, appealDays: 21, exclusions: ['crash_damage', 'water_ingress', 'modification', 'commercial_use'] },
    { category: 'battery', months: 24, cycles: 600, capacityPct: 75, coreDays: 20, reviewDays: 4, appealDays: 21, exclusions: ['crash_damage', 'water_ingress', 'modification'] },
    { category: 'controller', months: 24, coreDays: 20, reviewDays: 4, appealDays: 21, exclusions: ['water_ingress', 'modification'] },
    { category: 'display', months: 12, coreDays: 20, reviewDays: 4, appealDays: 21, exclusions: ['crash_damage'] },
    { category: 'frame', months: 60, coreDays: 30, reviewDays: 4, appealDays: 21, exclusions: ['crash_damage', 'commercial_use'] },
    { category: 'charger', months: 12, coreDays: 20, reviewDays: 4, appealDays: 21, exclusions: [] },
    { category: 'other', months: 12, coreDays: 20, reviewDays: 4, appealDays: 21, exclusions: ['wear_item'] },
  ],
};

export const demoLabor: Record<string, { code: string; description: string; category: Category | null; hours: string }[]> = {
  torvane: [
    { code: 'DU-RR', description: 'Remove and refit drive unit, incl. crank arms and chainline check', category: 'drive_unit', hours: '1.20' },
    { code: 'BAT-RR', description: 'Swap frame battery and update system firmware', category: 'battery', hours: '0.30' },
    { code: 'CT-RR', description: 'Replace motor controller and re-route harness', category: 'controller', hours: '0.80' },
    { code: 'DP-RR', description: 'Replace display and handlebar remote', category: 'display', hours: '0.50' },
    { code: 'CH-RR', description: 'Charger exchange and charge-port check', category: 'charger', hours: '0.10' },
    { code: 'LT-BA', description: 'Load test before and after repair (dyno or capacity discharge)', category: null, hours: '0.80' },
  ],
  wrenfield: [
    { code: 'HM-WHL', description: 'Rebuild rear wheel around replacement hub motor, true and tension', category: 'drive_unit', hours: '2.00' },
    { code: 'BAT-SW', description: 'Battery swap and mount inspection', category: 'battery', hours: '0.30' },
    { code: 'CTL-SW', description: 'Controller swap and wiring inspection', category: 'controller', hours: '1.00' },
    { code: 'LCD-SW', description: 'Display swap', category: 'display', hours: '0.40' },
    { code: 'FRM-XF', description: 'Transfer all components to replacement frame', category: 'frame', hours: '4.50' },
    { code: 'LT-BA', description: 'Load test before and after repair (dyno or capacity discharge)', category: null, hours: '0.75' },
  ],
};

// Brand calendars for the review and core-return clocks (demo lists).
export const demoHolidays: Record<string, [string, string][]> = {
  torvane: [
    ['2026-01-01', 'New Year’s Day'], ['2026-04-03', 'Good Friday'], ['2026-04-06', 'Easter Monday'], ['2026-04-27', 'King’s Day'],
    ['2026-05-05', 'Liberation Day'], ['2026-05-14', 'Ascension Day'], ['2026-05-25', 'Whit Monday'], ['2026-12-24', 'Company closure'],
    ['2026-12-25', 'Christmas Day'], ['2026-12-31', 'Company closure'], ['2027-01-01', 'New Year’s Day'], ['2027-03-26', 'Good Friday'],
    ['2027-03-29', 'Easter Monday'], ['2027-04-27', 'King’s Day'], ['2027-05-06', 'Ascension Day'], ['2027-05-17', 'Whit Monday'],
  ],
  wrenfield: [
    ['2026-01-01', 'New Year’s Day'], ['2026-01-19', 'Martin Luther King Jr. Day'], ['2026-02-16', 'Presidents’ Day'],
    ['2026-05-25', 'Memorial Day'], ['2026-06-19', 'Juneteenth'], ['2026-07-03', 'Independence Day (observed)'],
    ['2026-09-07', 'Labor Day'], ['2026-11-26', 'Thanksgiving'], ['2026-11-27', 'Day after Thanksgiving'], ['2026-12-25', 'Christmas Day'],
    ['2027-01-01', 'New Year’s Day'], ['2027-01-18', 'Martin Luther King Jr. Day'], ['2027-02-15', 'Presidents’ Day'],
    ['2027-05-31', 'Memorial Day'], ['2027-06-18', 'Juneteenth (observed)'], ['2027-07-05', 'Independence Day (observed)'],
  ],
};

export type DemoUnit = { frameSerial: string; model: string; sold: string; dealer: string; components: Record<string, string> };

export const demoUnits: Record<string, DemoUnit[]> = {
  torvane: [
    { frameSerial: 'KT25-004187', model: 'KST-T', sold: '2025-04-12', dealer: 'kettenblatt', components: { drive_unit: 'DU85-2503-11872', battery: 'BP625-2504-07731', display: 'DPC2-2502-33310' } },
    { frameSerial: 'KT25-004522', model: 'KST-T', sold: '2025-06-03', dealer: 'kettenblatt', components: { drive_unit: 'DU85-2505-12904', battery: 'BP625-2505-08102', display: 'DPC2-2504-34877' } },
    { frameSerial: 'KT24-001903', model: 'KST-T', sold: '2024-03-18', dealer: 'kettenblatt', components: { drive_unit: 'DU85-2402-04410', battery: 'BP625-2402-01987' } },
    { frameSerial: 'HC24-000311', model: 'HRR-C', sold: '2024-11-29', dealer: 'kettenblatt', components: { drive_unit: 'DU85-2410-09921', battery: 'BP500-2410-05510' } },
    { frameSerial: 'KU25-007740', model: 'KST-U', sold: '2025-08-21', dealer: 'lanternhill', components: { drive_unit: 'DU60-2507-02231', battery: 'BP500-2507-06632', display: 'DPC2-2507-40012' } },
    { frameSerial: 'KU25-007812', model: 'KST-U', sold: '2025-09-02', dealer: 'lanternhill', components: { drive_unit: 'DU60-2508-02477', battery: 'BP500-2508-06790' } },
    { frameSerial: 'SW25-010455', model: 'SWF-S', sold: '2025-05-16', dealer: 'lanternhill', components: { drive_unit: 'DU85-2504-12201', battery: 'BP625-2504-07902' } },
    { frameSerial: 'SW25-010613', model: 'SWF-S', sold: '2026-02-07', dealer: 'tidewheel', components: { drive_unit: 'DU85-2512-15500', battery: 'BP625-2512-10114' } },
    { frameSerial: 'KT26-000220', model: 'KST-T', sold: '2026-03-28', dealer: 'tidewheel', components: { drive_unit: 'DU85-2602-16032', battery: 'BP625-2602-10650' } },
    { frameSerial: 'KT25-005016', model: 'KST-T', sold: '2025-07-11', dealer: 'kettenblatt', components: { drive_unit: 'DU85-2506-13350', battery: 'BP625-2506-08417' } },
    { frameSerial: 'KU25-008133', model: 'KST-U', sold: '2025-09-19', dealer: 'lanternhill', components: { drive_unit: 'DU60-2509-02690', battery: 'BP500-2509-06911' } },
    { frameSerial: 'KU25-008410', model: 'KST-U', sold: '2025-10-11', dealer: 'lanternhill', components: { drive_unit: 'DU60-2510-02811', battery: 'BP500-2510-07020', controller: 'CT20-2510-35102' } },
    { frameSerial: 'SW26-010702', model: 'SWF-S', sold: '2026-01-24', dealer: 'tidewheel', components: { drive_unit: 'DU85-2601-15622', battery: 'BP625-2601-10230' } },
    { frameSerial: 'HC24-000347', model: 'HRR-C', sold: '2024-12-14', dealer: 'kettenblatt', components: { drive_unit: 'DU85-2411-10018', battery: 'BP500-2411-05602' } },
  ],
  wrenfield: [
    { frameSerial: 'WLT25M-08812', model: 'LRK-TR', sold: '2025-03-08', dealer: 'lanternhill', components: { drive_unit: 'HM750-25-1103', battery: 'B4814-25-7720', display: 'LCD3-25-5501', frame: 'WLT25M-08812' } },
    { frameSerial: 'WLT25M-09104', model: 'LRK-TR', sold: '2025-07-19', dealer: 'lanternhill', components: { drive_unit: 'HM750-25-1390', battery: 'B4814-25-8014', frame: 'WLT25M-09104' } },
    { frameSerial: 'WLT25M-09288', model: 'LRK-TR', sold: '2025-08-30', dealer: 'lanternhill', components: { drive_unit: 'HM750-25-1472', battery: 'B4814-25-8233', frame: 'WLT25M-09288' } },
    { frameSerial: 'WQC25-22071', model: 'QRY-CT', sold: '2025-10-04', dealer: 'lanternhill', components: { drive_unit: 'HM500-25-4410', battery: 'B3610-25-3301', display: 'LCD3-25-6120' } },
    { frameSerial: 'WLM24-03318', model: 'LMD-TO', sold: '2025-01-11', dealer: 'tidewheel', components: { drive_unit: 'HM750-24-0712', battery: 'B4814-24-2291' } },
    { frameSerial: 'WLM25-04102', model: 'LMD-TO', sold: '2025-12-13', dealer: 'tidewheel', components: { drive_unit: 'HM750-25-2215', battery: 'B4814-25-9177', extender: 'RX26-25-0412' } },
    { frameSerial: 'WQE25-11504', model: 'QRY-EU', sold: '2025-09-27', dealer: 'kettenblatt', components: { drive_unit: 'HM500-25-4822', battery: 'B3610-25-3590' } },
  ],
};
