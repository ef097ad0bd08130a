// Default data only: the seed loads it into the database and the engine takes rows as input.
export { CROPS, SAMPLE_UNITS } from './library/crops';
export { PESTS } from './library/pests';
export { THRESHOLDS } from './library/thresholds';
export { DEFAULT_ENEMY_RULES } from './enemies';
export { SPEED_SCOUTING_SOYBEAN } from './speedScout';
export { SUCROSE_TO_GLUCOSE } from './sapDrain';
