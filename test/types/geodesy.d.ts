// Minimal typings for the parts of the geodesy package (used only in tests as an independent reference).
declare module 'geodesy/latlon-nvector-ellipsoidal.js' {
  export default class LatLon {
    constructor(lat: number, lon: number, height?: number);
    deltaTo(point: LatLon): { north: number; east: number; down: number; length: number; bearing: number; elevation: number };
    toCartesian(): { x: number; y: number; z: number };
  }
}
declare module 'geodesy/latlon-ellipsoidal.js' {
  export class Cartesian {
    constructor(x: number, y: number, z: number);
    toLatLon(): { lat: number; lon: number; height: number };
  }
}
