export { MoistureInputError } from './errors.ts';
export {
  FLOOR_LIFE_CONDITIONS,
  MSL_FLOOR_LIFE,
  MSL_LEVELS,
  floorLifeHours,
  normaliseMslLevel,
  requireMslLevel,
} from './msl-levels.ts';
export type { MslFloorLife, MslLevel } from './msl-levels.ts';
export { floorLifeStatus } from './floor-life.ts';
export type { FloorLifeInput, FloorLifeState, FloorLifeStatus } from './floor-life.ts';
