// Water conductivity: temperature compensation to 25 °C. Pure functions; errors are WaterInputError.
export {
  WaterInputError,
  conductivityAt25C,
  conductivityAt25CNonLinear,
  f25NaturalWater,
  ISO7888_F25,
  type F25Point,
} from "./conductivity";
