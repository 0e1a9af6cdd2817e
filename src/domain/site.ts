import { DEG } from './constants.js';

/** A site as the API gives it: geodetic latitude and longitude [deg], height above the ellipsoid [m]. */
export interface Site {
  latitudeDeg: number;
  longitudeDeg: number;
  heightM: number;
}

export const latitudeRad = (site: Site) => site.latitudeDeg * DEG;
export const longitudeRad = (site: Site) => site.longitudeDeg * DEG;
