export * from './realization';
export * from './realize';
export { DEFAULT_DC_PATH_ERROR_DB } from './options';
export { ladderCharacteristicOmega, ladderResistanceLevel, CHOICE_SIGNIFICANT_DIGITS } from './gic-choices';
export { toFloatPassbandErrorDb, toFloatHalfPowerOmega, passbandGrid } from './dc-path';
