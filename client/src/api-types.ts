/**
 * Generated from openapi/openapi.json by client/scripts/write-api-types.ts (openapi-typescript); do not edit.
 * Regenerate with `npm run client:types` after `npm run openapi`.
 */
/* eslint-disable max-len -- descriptions from the OpenAPI document, one line each */
export interface paths {
  '/v1/ready': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** Readiness: dependencies reachable (database, migrations), estimation workers warmed up at start; 503 otherwise or while shutting down */
    get: {
      parameters: {
        query?: never;
        header?: never;
        path?: never;
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              /** @enum {string} */
              status: 'ready' | 'not-ready';
              /** @description Each check: "ok" or why it failed */
              checks: {
                [key: string]: string;
              };
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description Default Response */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              /** @enum {string} */
              status: 'ready' | 'not-ready';
              /** @description Each check: "ok" or why it failed */
              checks: {
                [key: string]: string;
              };
            };
          };
        };
      };
    };
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/health': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** Liveness: the process is up and serving */
    get: {
      parameters: {
        query?: never;
        header?: never;
        path?: never;
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              /** @enum {string} */
              status: 'ok';
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/zenith-delays': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /**
     * A-priori zenith hydrostatic, wet and total delay at a site
     * @description ZHD by Saastamoinen (Davis et al. 1985, IERS 2010 eq. 9.11) from surface pressure; ZWD by the chosen wet model from temperature and humidity. Met measured at another height is reduced to the site; missing met comes from the standard atmosphere (Berg 1948) and the response says so. Body limit: 1 MiB.
     */
    post: {
      parameters: {
        query?: never;
        header?: never;
        path?: never;
        cookie?: never;
      };
      requestBody: {
        content: {
          'application/json': {
            /** @description Site: geodetic coordinates on WGS84 */
            site: {
              /** @description Geodetic latitude [deg], [-90, 90] deg */
              latitude_deg: number;
              /** @description Longitude, east positive [deg], [-180, 360] deg */
              longitude_deg: number;
              /** @description Height above the WGS84 ellipsoid [m], [-500, 9000] m */
              height_m: number;
            };
            /**
             * Format: date-time
             * @description Epoch, ISO 8601 date-time (UTC, e.g. 2026-03-14T12:00:00Z; an offset is converted to UTC)
             */
            epoch: string;
            /** @description Surface met. Missing values come from the standard atmosphere at the site height (and the response says so) */
            met?: {
              /** @description Surface pressure [hPa], [300, 1100] hPa */
              pressure_hpa?: number;
              /** @description Air temperature [°C], [-90, 60] °C */
              temperature_c?: number;
              /** @description Relative humidity with respect to water [%], [0, 100] % */
              relative_humidity_pct?: number;
              /** @description Dew-point temperature [°C], [-90, 60] °C */
              dewpoint_c?: number;
              /** @description Water vapour pressure [hPa], [0, 200] hPa */
              vapour_pressure_hpa?: number;
              /** @description Height of the met sensor (same datum as the site); absent = at the site height [m], [-500, 9000] m */
              height_m?: number;
            };
            /**
             * @description Zenith wet delay model; one of saastamoinen, askne-nordius
             * @default saastamoinen
             * @enum {string}
             */
            wet_model?: 'saastamoinen' | 'askne-nordius';
          };
        };
      };
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              /** @description Zenith hydrostatic delay [m] */
              zhd_m: number;
              /** @description Zenith wet delay [m] */
              zwd_m: number;
              /** @description Zenith total delay [m] */
              ztd_m: number;
              met_used: {
                /** @description Pressure at the site height [hPa] */
                pressure_hpa: number;
                /** @description Temperature at the site height [°C] */
                temperature_c: number;
                /** @description Water vapour pressure at the site height [hPa] */
                vapour_pressure_hpa: number;
                source: {
                  /** @enum {string} */
                  pressure: 'measured' | 'reduced' | 'standard-atmosphere';
                  /** @enum {string} */
                  temperature: 'measured' | 'reduced' | 'standard-atmosphere';
                  /** @enum {string} */
                  humidity: 'measured' | 'reduced' | 'standard-atmosphere';
                };
              };
              /** @description EGM96 geoid undulation N at the site [m]: heights above sea level (Niell height correction, standard atmosphere) are height_m − N */
              geoid_undulation_m: number;
              /** @description The models and settings that produced this result */
              models: {
                [key: string]: string | number | boolean | null;
              };
              /** @description Short hash of `models`: results are homogeneous only when it is equal */
              model_fingerprint: string;
              /** @description Values defaulted or extrapolated, elevations below 3°, and similar */
              warnings: string[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        413: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        415: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        422: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/mapping-factors': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /**
     * Hydrostatic, wet and gradient mapping factors at given elevations
     * @description Mapping functions in the normalised continued-fraction form (Marini 1972): niell (Niell 1996, default), vmf1 (Boehm et al. 2006 with caller a coefficients), chao (Chao 1972), cosecant. Gradient mapping: chen-herring (default) or tilting. Body limit: 33554432 bytes (32 MiB); a body above 131072 bytes is computed in the worker pool (503 with Retry-After when its queue is full).
     */
    post: {
      parameters: {
        query?: never;
        header?: never;
        path?: never;
        cookie?: never;
      };
      requestBody: {
        content: {
          'application/json': {
            /** @description Site: geodetic coordinates on WGS84 */
            site: {
              /** @description Geodetic latitude [deg], [-90, 90] deg */
              latitude_deg: number;
              /** @description Longitude, east positive [deg], [-180, 360] deg */
              longitude_deg: number;
              /** @description Height above the WGS84 ellipsoid [m], [-500, 9000] m */
              height_m: number;
            };
            /**
             * Format: date-time
             * @description Epoch, ISO 8601 date-time (UTC, e.g. 2026-03-14T12:00:00Z; an offset is converted to UTC)
             */
            epoch: string;
            /** @description Vacuum elevations [deg], (0, 90], 1..100000 of them */
            elevations_deg: number[];
            /**
             * @description Mapping function; one of niell, vmf1, chao, cosecant
             * @default niell
             * @enum {string}
             */
            model?: 'niell' | 'vmf1' | 'chao' | 'cosecant';
            /** @description Coefficients for model "vmf1", from the VMF1 grids or site files for the epoch */
            coefficients?: {
              /** @description VMF1 hydrostatic a coefficient [], [0.0005, 0.002] */
              ah: number;
              /** @description VMF1 wet a coefficient [], [0, 0.001] */
              aw: number;
              /**
               * @description What ah refers to: "sea-level" (grid coefficients: Niell's height correction is added from the site's height above sea level) or "site" (coefficients computed at the site: no height correction). Absent: "sea-level", with a warning
               * @enum {string}
               */
              height_reference?: 'site' | 'sea-level';
            };
            /**
             * @description Gradient mapping function; one of chen-herring, tilting
             * @default chen-herring
             * @enum {string}
             */
            gradient_model?: 'chen-herring' | 'tilting';
          };
        };
      };
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              model: string;
              /** @description Hydrostatic mapping factors [-], in the order of elevations_deg */
              hydrostatic: number[];
              /** @description Wet mapping factors [-] */
              wet: number[];
              /** @description Gradient mapping factors [-] */
              gradient: number[];
              /** @description EGM96 geoid undulation N at the site [m]: heights above sea level (Niell height correction, standard atmosphere) are height_m − N */
              geoid_undulation_m: number;
              /** @description The models and settings that produced this result */
              models: {
                [key: string]: string | number | boolean | null;
              };
              /** @description Short hash of `models`: results are homogeneous only when it is equal */
              model_fingerprint: string;
              /** @description Values defaulted or extrapolated, elevations below 3°, and similar */
              warnings: string[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        413: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        415: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/slant-delays': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /**
     * Slant delays along directions or towards satellites
     * @description slant = m_h ZHD + m_w ZWD + m_g (G_N cos a + G_E sin a). Zenith values not supplied come from met or the standard atmosphere; gradients default to 0. Directions may be given as elevation/azimuth or as satellite ECEF positions (WGS84). Up to 100 000 directions, as objects or as column arrays. Answer shapes: `shape=rows` (default), `shape=columns` (one array per field, rounded to the documented precision), `fields` to select; `Accept: application/vnd.apache.arrow.stream` answers an Apache Arrow IPC stream (the per-direction table at full precision, the rest of the answer as JSON in the schema metadata "answer"), and a body of that type is read as the rows table with the rest of the request as JSON in the schema metadata "request". Body limit: 33554432 bytes (32 MiB); a body above 131072 bytes is computed in the worker pool (503 with Retry-After when its queue is full).
     */
    post: {
      parameters: {
        query?: {
          /** @description rows: an array of objects (default); columns: one array per field, rounded to the documented precision */
          shape?: 'rows' | 'columns';
          /** @description Comma-separated per-row fields to return (default: all); applies to rows, columns and Arrow answers */
          fields?: string;
        };
        header?: never;
        path?: never;
        cookie?: never;
      };
      requestBody: {
        content: {
          'application/json': {
            /** @description Site: geodetic coordinates on WGS84 */
            site: {
              /** @description Geodetic latitude [deg], [-90, 90] deg */
              latitude_deg: number;
              /** @description Longitude, east positive [deg], [-180, 360] deg */
              longitude_deg: number;
              /** @description Height above the WGS84 ellipsoid [m], [-500, 9000] m */
              height_m: number;
            };
            /**
             * Format: date-time
             * @description Epoch, ISO 8601 date-time (UTC, e.g. 2026-03-14T12:00:00Z; an offset is converted to UTC)
             */
            epoch: string;
            /** @description Surface met. Missing values come from the standard atmosphere at the site height (and the response says so) */
            met?: {
              /** @description Surface pressure [hPa], [300, 1100] hPa */
              pressure_hpa?: number;
              /** @description Air temperature [°C], [-90, 60] °C */
              temperature_c?: number;
              /** @description Relative humidity with respect to water [%], [0, 100] % */
              relative_humidity_pct?: number;
              /** @description Dew-point temperature [°C], [-90, 60] °C */
              dewpoint_c?: number;
              /** @description Water vapour pressure [hPa], [0, 200] hPa */
              vapour_pressure_hpa?: number;
              /** @description Height of the met sensor (same datum as the site); absent = at the site height [m], [-500, 9000] m */
              height_m?: number;
            };
            /**
             * @description Zenith wet delay model; one of saastamoinen, askne-nordius
             * @default saastamoinen
             * @enum {string}
             */
            wet_model?: 'saastamoinen' | 'askne-nordius';
            /**
             * @description Mapping function; one of niell, vmf1, chao, cosecant
             * @default niell
             * @enum {string}
             */
            model?: 'niell' | 'vmf1' | 'chao' | 'cosecant';
            /** @description Coefficients for model "vmf1", from the VMF1 grids or site files for the epoch */
            coefficients?: {
              /** @description VMF1 hydrostatic a coefficient [], [0.0005, 0.002] */
              ah: number;
              /** @description VMF1 wet a coefficient [], [0, 0.001] */
              aw: number;
              /**
               * @description What ah refers to: "sea-level" (grid coefficients: Niell's height correction is added from the site's height above sea level) or "site" (coefficients computed at the site: no height correction). Absent: "sea-level", with a warning
               * @enum {string}
               */
              height_reference?: 'site' | 'sea-level';
            };
            /**
             * @description Gradient mapping function; one of chen-herring, tilting
             * @default chen-herring
             * @enum {string}
             */
            gradient_model?: 'chen-herring' | 'tilting';
            /** @description Zenith values to map; what is missing comes from met or the standard atmosphere (gradients: 0) */
            zenith?: {
              /** @description Zenith hydrostatic delay [m], [1, 3] m */
              zhd_m?: number;
              /** @description Zenith wet delay [m], [0, 1] m */
              zwd_m?: number;
              /** @description North gradient G_N [m], [-0.05, 0.05] m */
              north_gradient_m?: number;
              /** @description East gradient G_E [m], [-0.05, 0.05] m */
              east_gradient_m?: number;
            };
            /** @description Directions, 1..100000, as objects or as column arrays; give either directions or satellites */
            directions?:
              | {
                  /** @description Vacuum (geometric) elevation angle; below 3° the answer carries a warning; mapping functions refuse elevations below 1° (a profile is still traced there) [deg], (0, 90] deg */
                  elevation_deg: number;
                  /** @description Azimuth from north through east [deg], [0, 360] deg */
                  azimuth_deg: number;
                }[]
              | {
                  elevation_deg: number[];
                  azimuth_deg: number[];
                };
            /** @description Satellite positions, ECEF WGS84 [m], as objects or as column arrays; elevation and azimuth are computed from the site */
            satellites?:
              | {
                  id: string;
                  /** @description Satellite X coordinate, ECEF WGS84 [m], [-100000000, 100000000] m */
                  x_m: number;
                  /** @description Satellite Y coordinate, ECEF WGS84 [m], [-100000000, 100000000] m */
                  y_m: number;
                  /** @description Satellite Z coordinate, ECEF WGS84 [m], [-100000000, 100000000] m */
                  z_m: number;
                }[]
              | {
                  id: string[];
                  x_m: number[];
                  y_m: number[];
                  z_m: number[];
                };
          };
        };
      };
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              zenith: {
                zhd_m: number;
                zwd_m: number;
                ztd_m: number;
                north_gradient_m: number;
                east_gradient_m: number;
                source: {
                  /** @enum {string} */
                  zhd: 'caller' | 'met';
                  /** @enum {string} */
                  zwd: 'caller' | 'met';
                  /** @enum {string} */
                  gradients: 'caller' | 'none';
                };
              };
              met_used?: {
                /** @description Pressure at the site height [hPa] */
                pressure_hpa: number;
                /** @description Temperature at the site height [°C] */
                temperature_c: number;
                /** @description Water vapour pressure at the site height [hPa] */
                vapour_pressure_hpa: number;
                source: {
                  /** @enum {string} */
                  pressure: 'measured' | 'reduced' | 'standard-atmosphere';
                  /** @enum {string} */
                  temperature: 'measured' | 'reduced' | 'standard-atmosphere';
                  /** @enum {string} */
                  humidity: 'measured' | 'reduced' | 'standard-atmosphere';
                };
              };
              /** @description One entry per direction (shape=rows), or one array per field (shape=columns: angles rounded to 1e-6 deg, mapping factors to 1e-8, delays to 1e-6 m); `fields` selects the fields */
              slants:
                | {
                    /** @description Vacuum elevation [deg] */
                    elevation_deg?: number;
                    /** @description Azimuth from north through east [deg], [0, 360) (360 is returned as 0) */
                    azimuth_deg?: number;
                    satellite?: string;
                    /** @description Nadir angle at the satellite [deg] (satellites only) */
                    nadir_deg?: number;
                    mapping_hydrostatic?: number;
                    mapping_wet?: number;
                    mapping_gradient?: number;
                    hydrostatic_m?: number;
                    wet_m?: number;
                    gradient_m?: number;
                    total_m?: number;
                  }[]
                | {
                    [key: string]: (number | string)[];
                  };
              /** @description EGM96 geoid undulation N at the site [m]: heights above sea level (Niell height correction, standard atmosphere) are height_m − N */
              geoid_undulation_m: number;
              /** @description The models and settings that produced this result */
              models: {
                [key: string]: string | number | boolean | null;
              };
              /** @description Short hash of `models`: results are homogeneous only when it is equal */
              model_fingerprint: string;
              /** @description Values defaulted or extrapolated, elevations below 3°, and similar */
              warnings: string[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        413: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        415: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/precipitable-water': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /**
     * Precipitable water vapour from zenith delays and surface met
     * @description PWV = Π(Tm) · ZWD with Π from Bevis et al. (1994) and Tm from Bevis et al. (1992) or the caller. ZWD = ZTD − ZHD(P) when a total delay is given, which then needs the measured pressure (never defaulted). σ_PWV is the root sum of squares of its budget: the delay's sigma (no default: without it σ is null), pressure (default 0.5 hPa), the ZHD model, the surface temperature (default 0.5 K), Tm (4.74 K for the Bevis regression, default 2 K for a caller's tm_k) and the refractivity constants; sigma_budget=true lists the terms per record. Body limit: 33554432 bytes (32 MiB); a body above 131072 bytes is computed in the worker pool (503 with Retry-After when its queue is full).
     */
    post: {
      parameters: {
        query?: never;
        header?: never;
        path?: never;
        cookie?: never;
      };
      requestBody: {
        content: {
          'application/json': {
            /** @description Site: geodetic coordinates on WGS84 */
            site: {
              /** @description Geodetic latitude [deg], [-90, 90] deg */
              latitude_deg: number;
              /** @description Longitude, east positive [deg], [-180, 360] deg */
              longitude_deg: number;
              /** @description Height above the WGS84 ellipsoid [m], [-500, 9000] m */
              height_m: number;
            };
            records: {
              /**
               * Format: date-time
               * @description Epoch, ISO 8601 date-time (UTC, e.g. 2026-03-14T12:00:00Z; an offset is converted to UTC)
               */
              epoch: string;
              /** @description Zenith total delay [m], [1, 3] m */
              ztd_m?: number;
              /** @description Zenith wet delay [m], [0, 1] m */
              zwd_m?: number;
              /** @description Standard deviation of ztd_m [m], > 0, at most 1 */
              ztd_sigma_m?: number;
              /** @description Standard deviation of zwd_m [m], > 0, at most 1 */
              zwd_sigma_m?: number;
              /** @description Measured surface pressure at the site; required with ztd_m [hPa], [300, 1100] hPa */
              pressure_hpa?: number;
              /** @description Standard deviation of pressure_hpa (default 0.5 hPa) [hPa], > 0, at most 50 */
              pressure_sigma_hpa?: number;
              /** @description Surface temperature, for Tm (Bevis 1992) when tm_k is absent [°C], [-90, 60] °C */
              temperature_c?: number;
              /** @description Standard deviation of temperature_c (default 0.5 K) [K], > 0, at most 20 */
              temperature_sigma_k?: number;
              /** @description Weighted mean temperature, if known (e.g. from a weather model) [K], [200, 330] K */
              tm_k?: number;
              /** @description Standard deviation of tm_k (default 2 K) [K], > 0, at most 50 */
              tm_sigma_k?: number;
            }[];
            /**
             * @description true: every record carries `sigma_budget`, the terms of pwv_sigma_mm one by one
             * @default false
             */
            sigma_budget?: boolean;
          };
        };
      };
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              records: {
                epoch: string;
                /** @description Zenith hydrostatic delay from the measured pressure [m]; null without pressure */
                zhd_m: number | null;
                /** @description Zenith wet delay [m] */
                zwd_m: number;
                /** @description Standard deviation of zwd_m [m]; null when the delay had no sigma */
                zwd_sigma_m: number | null;
                /** @description Weighted mean temperature [K] */
                tm_k: number;
                /** @description Standard deviation of tm_k [K] */
                tm_sigma_k: number;
                /** @description Π = PWV/ZWD [-] */
                conversion_factor: number;
                /** @description Precipitable water vapour [mm] */
                pwv_mm: number;
                /** @description Standard deviation of pwv_mm [mm], all terms of the budget; null when neither ztd_sigma_m nor zwd_sigma_m was given */
                pwv_sigma_mm: number | null;
                /** @description Terms of pwv_sigma_mm, each in mm of PWV; pwv_sigma_mm is their root sum of squares */
                sigma_budget?: {
                  /** @description From ztd_sigma_m (or zwd_sigma_m) [mm]; null when neither was given */
                  delay_mm: number | null;
                  /** @description From pressure_sigma_hpa through the ZHD [mm] (ZTD records only) */
                  pressure_mm: number;
                  /** @description Saastamoinen ZHD model, ±0.0000005 m/hPa (IERS 2010 eq. 9.11) [mm] (ZTD records only) */
                  zhd_model_mm: number;
                  /** @description From temperature_sigma_k through the Bevis Tm [mm] */
                  temperature_mm: number;
                  /** @description From tm_sigma_k or the 4.74 K scatter of the Bevis regression [mm] */
                  tm_mm: number;
                  /** @description From the uncertainties of k2' and k3 (Bevis et al. 1994) [mm]; systematic, common to all records */
                  refractivity_mm: number;
                  /** @description Input sigmas that were not given and took their documented default */
                  defaulted: string[];
                };
              }[];
              /** @description The models and settings that produced this result */
              models: {
                [key: string]: string | number | boolean | null;
              };
              /** @description Short hash of `models`: results are homogeneous only when it is equal */
              model_fingerprint: string;
              /** @description Values defaulted or extrapolated, elevations below 3°, and similar */
              warnings: string[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        413: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        415: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/zwd-estimates': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /**
     * Zenith wet delay and gradients estimated from residuals, with random-walk constraints
     * @description Least-squares estimate of r_i = m_w(e_i) δw(t_k) + m_g(e_i) [cos a_i G_N(t_k) + sin a_i G_E(t_k)] + b_k + ε_i with Niell (1996) wet mapping at the site latitude, Chen & Herring (1997) gradient mapping (C = 0.0032), δw, G_N, G_E piecewise linear between nodes T0 + jΔ under random-walk constraints, and one free bias b_k per epoch (pre-eliminated). Formal errors of the nodes and of δw at every epoch (with the covariance of the adjacent nodes); outlier screening by the normalised residual τ = v/(σ̂0 σ_v) (Pope 1976). With met records, each epoch also gets ZHD from the measured pressure, ZWD = ZTD − ZHD, Tm (Bevis et al. 1992) and PWV (Bevis et al. 1994). Bodies: application/json (this schema) or text/csv: a table with the header row epoch,satellite,elevation_deg,azimuth_deg,residual_m[,sigma_m], with the site and options as query parameters (latitude_deg, longitude_deg, height_m required; zwd_interval_s, gradients=on|off, gradient_interval_s, ..., "null" or "off" for null). Up to 900000 observations. Body limit: 100663296 bytes (96 MiB; 30 days of 30-s data from one 30-satellite constellation, about 826 000 observations, is about 73 MB as column arrays, 31 MB as Arrow). Answer shapes: `shape=rows` (default), `shape=columns` (every table as one array per field, rounded to the documented precision), `fields` to select (fields of series, or table.field of zwd_nodes, gradient_nodes, rejected); `Accept: application/vnd.apache.arrow.stream` answers an Apache Arrow IPC stream with series as the table and the rest of the answer (the other tables as columns) as JSON in the schema metadata "answer".
     */
    post: {
      parameters: {
        query?: {
          /** @description Geodetic latitude [deg], [-90, 90] deg */
          latitude_deg?: number;
          /** @description Longitude, east positive [deg], [-180, 360] deg */
          longitude_deg?: number;
          /** @description Height above the WGS84 ellipsoid [m], [-500, 9000] m */
          height_m?: number;
          /** @description ZHD the residuals were formed with; default: Saastamoinen ZHD of the standard atmosphere at the site [m], [1, 3] m */
          apriori_zhd_m?: number;
          /** @description ZWD the residuals were formed with; default 0 [m], [0, 1] m */
          apriori_zwd_m?: number;
          /** @description Spacing Δ of the ZWD nodes of the output, on round UTC epochs jΔ (multiples of Δ since 1970-01-01T00:00Z); with parametrisation "nodes" also the spacing of the piecewise-linear model [s], (0, 2592000] s */
          zwd_interval_s?: number;
          /** @description Random-walk density q of the ZWD: consecutive states x_{j+1} − x_j = 0 ± q √(Δt/1 h) (states at every epoch, or nodes) [m/√h], (0, 10] m/√h; null = no constraint */
          zwd_random_walk_m_per_sqrt_h?: number | null;
          /** @description A-priori constraint on the first ZWD node, x_0 = 0 ± σ [m], (0, 10] m; null = none */
          zwd_apriori_sigma_m?: number | null;
          /** @description Spacing of the gradient nodes of the output (round UTC epochs; with parametrisation "nodes" the model's nodes) [s], (0, 2592000] s */
          gradient_interval_s?: number;
          /** @description Random-walk density q of each gradient component: consecutive states x_{j+1} − x_j = 0 ± q √(Δt/1 h) [m/√h], (0, 10] m/√h; null = no constraint */
          gradient_random_walk_m_per_sqrt_h?: number | null;
          /** @description A-priori constraint on the first gradient node, x_0 = 0 ± σ [m], (0, 1] m; null = none */
          gradient_apriori_sigma_m?: number | null;
          /** @description Estimate one free bias per epoch (receiver clock and other common terms); pre-eliminated */
          epoch_bias?: boolean;
          /** @description σ_i of observations without sigma_m, σ² = a² + b²/sin²e: "elevation" b = sigma0_m, a = 0; "uniform" a = sigma0_m, b = 0; "elevation-components" b = sigma0_m and a = sigma_constant_m (both re-estimated with scale_sigmas); one of elevation, uniform, elevation-components */
          weighting?: 'elevation' | 'uniform' | 'elevation-components';
          /** @description σ0 of the weighting scheme (zenith standard deviation of a residual) [m], (0, 1] m */
          sigma0_m?: number;
          /** @description Observations below this elevation are dropped (and counted) [deg], [0, 90) deg */
          elevation_cutoff_deg?: number;
          /** @description Reject while the largest |normalised residual| (Pope τ = v/(σ̂0 σ_v)) exceeds k [], [2, 1000]; null = no screening */
          outlier_threshold?: number | null;
          /** @description one-per-solution: reject the largest τ > k, re-solve, repeat. one-per-window: in each iteration also reject the largest τ > k of every stretch more than a window away from the others (nodes: max(3 ZWD intervals, 30 min); every-epoch: the smoother kernel length, 5–30 min; same result at a cost linear in the span); one of one-per-window, one-per-solution */
          outlier_rejection?: 'one-per-window' | 'one-per-solution';
          /** @description Screening stops after this many rejections, with a warning [], [0, 100000] */
          max_rejections?: number;
          /** @description Re-estimate the observation weights from the residuals (variance components: σ0, or a and b of "elevation-components") and solve again; the random-walk and a-priori constraints keep their sigmas. false = the weights as given */
          scale_sigmas?: boolean;
          /** @description a of weighting "elevation-components" (σ² = a² + b²/sin²e), the starting value when scale_sigmas re-estimates it; ignored by the other schemes [m], [0, 1] m; null = sigma0_m / 3 */
          sigma_constant_m?: number | null;
          /** @description every-epoch: a random-walk state of ZWD and gradients at every epoch, nodes interpolated with the Brownian-bridge variance (formal errors hold at any node spacing). nodes: piecewise linear between the nodes (the variation between nodes is not in σ); one of every-epoch, nodes */
          parametrisation?: 'every-epoch' | 'nodes';
          /** @description Estimate the residuals' time correlation per satellite arc and inflate the formal errors by it (docs/zwd-estimation.md, "Formal errors") */
          correlated_noise?: boolean;
          /** @description Wet mapping function of the estimator (src/domain/mapping registry). vmf1 needs per-epoch coefficients in the JSON body's vmf1_coefficients [{epoch, a_h, a_w}], interpolated linearly in time and spanning every observation epoch (a text/csv request cannot carry them); one of niell, vmf1, chao, cosecant */
          wet_mapping?: 'niell' | 'vmf1' | 'chao' | 'cosecant';
          /** @description Longest gap between met records that is interpolated across (the same setting as met_max_gap_s of the station PWV route) [s], (0, 86400] s */
          met_max_gap_s?: number;
          /** @description Estimate gradients (on) or not (off) */
          gradients?: 'on' | 'off';
          /** @description rows: an array of objects (default); columns: one array per field, rounded to the documented precision */
          shape?: 'rows' | 'columns';
          /** @description Comma-separated per-row fields to return (default: all); applies to rows, columns and Arrow answers */
          fields?: string;
        };
        header?: never;
        path?: never;
        cookie?: never;
      };
      requestBody: {
        content: {
          'application/json': {
            /** @description Residuals of one station, in any order; grouped by epoch. An array of objects, or an object of column arrays */
            observations:
              | {
                  /**
                   * Format: date-time
                   * @description Epoch, ISO 8601 date-time (UTC, e.g. 2026-03-14T12:00:00Z; an offset is converted to UTC)
                   */
                  epoch: string;
                  /** @description Satellite identifier; each (epoch, satellite) pair may appear once */
                  satellite: string;
                  /** @description Vacuum (geometric) elevation angle; below 3° the answer carries a warning; mapping functions refuse elevations below 1° (a profile is still traced there) [deg], (0, 90] deg */
                  elevation_deg: number;
                  /** @description Azimuth from north through east [deg], [0, 360] deg */
                  azimuth_deg: number;
                  /** @description Residual formed with the a-priori troposphere (observed − computed); may contain a receiver clock [m], [-1000000, 1000000] m */
                  residual_m: number;
                  /** @description Standard deviation of residual_m; absent = from options.weighting and sigma0_m [m], > 0, at most 10 */
                  sigma_m?: number;
                }[]
              | {
                  epoch: string[];
                  satellite: string[];
                  elevation_deg: number[];
                  azimuth_deg: number[];
                  residual_m: number[];
                  sigma_m: number[];
                };
            /** @description The a-priori zenith delays the residuals were formed with */
            apriori?: {
              /** @description ZHD the residuals were formed with; default: Saastamoinen ZHD of the standard atmosphere at the site [m], [1, 3] m */
              zhd_m?: number;
              /** @description ZWD the residuals were formed with; default 0 [m], [0, 1] m */
              zwd_m?: number;
            };
            /** @description Surface met at the site, interpolated linearly to the epochs (not across gaps longer than options.met_max_gap_s); enables ZHD, ZWD and PWV per epoch */
            met?: {
              /**
               * Format: date-time
               * @description Epoch, ISO 8601 date-time (UTC, e.g. 2026-03-14T12:00:00Z; an offset is converted to UTC)
               */
              epoch: string;
              /** @description Measured surface pressure at the site height [hPa], [300, 1100] hPa */
              pressure_hpa: number;
              /** @description Measured surface temperature at the site height [°C], [-90, 60] °C */
              temperature_c: number;
              /** @description Relative humidity [%], 0..100; accepted, not needed for PWV */
              relative_humidity_pct?: number;
            }[];
            /** @description VMF1 a coefficients per epoch (Boehm et al. 2006; from the VMF1 grids or site files), for options.wet_mapping "vmf1" and only then: a_w maps the wet delay, interpolated linearly in time between the given epochs, which must span every observation epoch (no extrapolation: 400 otherwise). a_h is taken for completeness (the estimator maps the wet delay only) */
            vmf1_coefficients?: {
              /**
               * Format: date-time
               * @description Epoch, ISO 8601 date-time (UTC, e.g. 2026-03-14T12:00:00Z; an offset is converted to UTC)
               */
              epoch: string;
              /** @description VMF1 hydrostatic a coefficient [], [0.0005, 0.002] */
              a_h: number;
              /** @description VMF1 wet a coefficient [], [0, 0.001] */
              a_w: number;
            }[];
            /**
             * @description Estimation options; every one has a default (docs/zwd-estimation.md lists them)
             * @default {}
             */
            options?: {
              /**
               * @description Spacing Δ of the ZWD nodes of the output, on round UTC epochs jΔ (multiples of Δ since 1970-01-01T00:00Z); with parametrisation "nodes" also the spacing of the piecewise-linear model [s], (0, 2592000] s
               * @default 300
               */
              zwd_interval_s?: number;
              /**
               * @description Random-walk density q of the ZWD: consecutive states x_{j+1} − x_j = 0 ± q √(Δt/1 h) (states at every epoch, or nodes) [m/√h], (0, 10] m/√h; null = no constraint
               * @default 0.01
               */
              zwd_random_walk_m_per_sqrt_h?: number | null;
              /**
               * @description A-priori constraint on the first ZWD node, x_0 = 0 ± σ [m], (0, 10] m; null = none
               * @default 0.5
               */
              zwd_apriori_sigma_m?: number | null;
              /**
               * @description Estimate one free bias per epoch (receiver clock and other common terms); pre-eliminated
               * @default true
               */
              epoch_bias?: boolean;
              /**
               * @description σ_i of observations without sigma_m, σ² = a² + b²/sin²e: "elevation" b = sigma0_m, a = 0; "uniform" a = sigma0_m, b = 0; "elevation-components" b = sigma0_m and a = sigma_constant_m (both re-estimated with scale_sigmas); one of elevation, uniform, elevation-components
               * @default elevation
               * @enum {string}
               */
              weighting?: 'elevation' | 'uniform' | 'elevation-components';
              /**
               * @description σ0 of the weighting scheme (zenith standard deviation of a residual) [m], (0, 1] m
               * @default 0.003
               */
              sigma0_m?: number;
              /**
               * @description Observations below this elevation are dropped (and counted) [deg], [0, 90) deg
               * @default 7
               */
              elevation_cutoff_deg?: number;
              /**
               * @description Reject while the largest |normalised residual| (Pope τ = v/(σ̂0 σ_v)) exceeds k [], [2, 1000]; null = no screening
               * @default 4
               */
              outlier_threshold?: number | null;
              /**
               * @description one-per-solution: reject the largest τ > k, re-solve, repeat. one-per-window: in each iteration also reject the largest τ > k of every stretch more than a window away from the others (nodes: max(3 ZWD intervals, 30 min); every-epoch: the smoother kernel length, 5–30 min; same result at a cost linear in the span); one of one-per-window, one-per-solution
               * @default one-per-window
               * @enum {string}
               */
              outlier_rejection?: 'one-per-window' | 'one-per-solution';
              /**
               * @description Screening stops after this many rejections, with a warning [], [0, 100000]
               * @default 1000
               */
              max_rejections?: number;
              /**
               * @description Re-estimate the observation weights from the residuals (variance components: σ0, or a and b of "elevation-components") and solve again; the random-walk and a-priori constraints keep their sigmas. false = the weights as given
               * @default true
               */
              scale_sigmas?: boolean;
              /**
               * @description a of weighting "elevation-components" (σ² = a² + b²/sin²e), the starting value when scale_sigmas re-estimates it; ignored by the other schemes [m], [0, 1] m; null = sigma0_m / 3
               * @default null
               */
              sigma_constant_m?: number | null;
              /**
               * @description every-epoch: a random-walk state of ZWD and gradients at every epoch, nodes interpolated with the Brownian-bridge variance (formal errors hold at any node spacing). nodes: piecewise linear between the nodes (the variation between nodes is not in σ); one of every-epoch, nodes
               * @default every-epoch
               * @enum {string}
               */
              parametrisation?: 'every-epoch' | 'nodes';
              /**
               * @description Estimate the residuals' time correlation per satellite arc and inflate the formal errors by it (docs/zwd-estimation.md, "Formal errors")
               * @default true
               */
              correlated_noise?: boolean;
              /**
               * @description Wet mapping function of the estimator (src/domain/mapping registry). vmf1 needs per-epoch coefficients in the JSON body's vmf1_coefficients [{epoch, a_h, a_w}], interpolated linearly in time and spanning every observation epoch (a text/csv request cannot carry them); one of niell, vmf1, chao, cosecant
               * @default niell
               * @enum {string}
               */
              wet_mapping?: 'niell' | 'vmf1' | 'chao' | 'cosecant';
              /**
               * @description Longest gap between met records that is interpolated across (the same setting as met_max_gap_s of the station PWV route) [s], (0, 86400] s
               * @default 10800
               */
              met_max_gap_s?: number;
              /** @default {} */
              gradients?: {
                /**
                 * @description Spacing of the gradient nodes of the output (round UTC epochs; with parametrisation "nodes" the model's nodes) [s], (0, 2592000] s
                 * @default 21600
                 */
                interval_s?: number;
                /**
                 * @description Random-walk density q of each gradient component: consecutive states x_{j+1} − x_j = 0 ± q √(Δt/1 h) [m/√h], (0, 10] m/√h; null = no constraint
                 * @default 0.001
                 */
                random_walk_m_per_sqrt_h?: number | null;
                /**
                 * @description A-priori constraint on the first gradient node, x_0 = 0 ± σ [m], (0, 1] m; null = none
                 * @default 0.01
                 */
                apriori_sigma_m?: number | null;
              } | null;
            };
            /** @description Site: geodetic coordinates on WGS84 */
            site: {
              /** @description Geodetic latitude [deg], [-90, 90] deg */
              latitude_deg: number;
              /** @description Longitude, east positive [deg], [-180, 360] deg */
              longitude_deg: number;
              /** @description Height above the WGS84 ellipsoid [m], [-500, 9000] m */
              height_m: number;
            };
          };
        };
      };
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              /** @description ZWD nodes. shape=rows: one object per row (with `fields`: the selected fields); shape=columns: one array per field, rounded to the documented precision (delays 1e-6 m, PWV 1e-4 mm, Tm 1e-4 K), null where a row has no value */
              zwd_nodes:
                | {
                    /** @description Node epoch jΔ on round UTC epochs */
                    epoch: string;
                    /** @description Estimated correction δw to the a-priori ZWD [m] */
                    correction_m: number;
                    /** @description A-priori ZWD + correction [m] (the nodes carry no met: series[].zwd_m is ztd_m − the ZHD of its zhd_source) */
                    zwd_m: number;
                    /** @description Formal standard deviation [m] (with the Brownian-bridge variance between epochs and the correlated-noise factor) */
                    sigma_m: number;
                    /** @description Used observations within one interval of the node; 0 = the value comes from the random walk alone (a node without data) */
                    observations_nearby: number;
                  }[]
                | {
                    /** @description Node epoch jΔ on round UTC epochs */
                    epoch?: string;
                    /** @description Estimated correction δw to the a-priori ZWD [m] */
                    correction_m?: number;
                    /** @description A-priori ZWD + correction [m] (the nodes carry no met: series[].zwd_m is ztd_m − the ZHD of its zhd_source) */
                    zwd_m?: number;
                    /** @description Formal standard deviation [m] (with the Brownian-bridge variance between epochs and the correlated-noise factor) */
                    sigma_m?: number;
                    /** @description Used observations within one interval of the node; 0 = the value comes from the random walk alone (a node without data) */
                    observations_nearby?: number;
                  }[]
                | {
                    [key: string]: (number | string | null)[];
                  };
              /** @description Gradient nodes; empty when gradients are off. shape=rows: one object per row (with `fields`: the selected fields); shape=columns: one array per field, rounded to the documented precision (delays 1e-6 m, PWV 1e-4 mm, Tm 1e-4 K), null where a row has no value */
              gradient_nodes:
                | {
                    epoch: string;
                    /** @description North gradient G_N [m] */
                    north_m: number;
                    /** @description East gradient G_E [m] */
                    east_m: number;
                    north_sigma_m: number;
                    east_sigma_m: number;
                    /** @description Used observations within one interval of the node; 0 = a node without data */
                    observations_nearby: number;
                  }[]
                | {
                    epoch?: string;
                    /** @description North gradient G_N [m] */
                    north_m?: number;
                    /** @description East gradient G_E [m] */
                    east_m?: number;
                    north_sigma_m?: number;
                    east_sigma_m?: number;
                    /** @description Used observations within one interval of the node; 0 = a node without data */
                    observations_nearby?: number;
                  }[]
                | {
                    [key: string]: (number | string | null)[];
                  };
              /** @description One entry per epoch with observations above the cutoff (the Arrow table of an Arrow answer). shape=rows: one object per row (with `fields`: the selected fields); shape=columns: one array per field, rounded to the documented precision (delays 1e-6 m, PWV 1e-4 mm, Tm 1e-4 K), null where a row has no value */
              series:
                | {
                    epoch: string;
                    /** @description δw interpolated between the adjacent nodes [m] */
                    correction_m: number;
                    /** @description ZWD = ztd_m − ZHD, one meaning at every epoch [m]: with met in the request, ZHD is the Saastamoinen ZHD of the surface pressure (interpolated within met_max_gap_s; across longer gaps bridged linearly, held from the nearest record beyond the records: zhd_source "met-bridged"); without met, the a-priori ZHD (zhd_source "apriori"). Continuous wherever ztd_m is */
                    zwd_m: number;
                    /**
                     * @description Where the ZHD behind zwd_m comes from: met (measured or interpolated pressure), met-bridged (an epoch without met), apriori (a request without met)
                     * @enum {string}
                     */
                    zhd_source: 'met' | 'met-bridged' | 'apriori';
                    /** @description Formal standard deviation of δw (with the covariance of the adjacent nodes) [m] */
                    sigma_m: number;
                    /** @description G_N at the epoch [m]; null when gradients are off */
                    north_gradient_m: number | null;
                    /** @description G_E at the epoch [m]; null when gradients are off */
                    east_gradient_m: number | null;
                    north_gradient_sigma_m: number | null;
                    east_gradient_sigma_m: number | null;
                    /** @description Estimated epoch bias [m]; null when epoch_bias is off or all observations of the epoch were rejected */
                    epoch_bias_m: number | null;
                    /** @description Observations of the epoch used in the final solution */
                    observations: number;
                    /** @description A-priori ZHD + a-priori ZWD + δw [m] */
                    ztd_m: number;
                    /**
                     * @description Met at this epoch: measured, interpolated or missing (only with met); "missing" epochs have no PWV and a bridged ZHD
                     * @enum {string}
                     */
                    met?: 'measured' | 'interpolated' | 'missing';
                    /** @description Saastamoinen ZHD of the surface pressure [m] (with met; at "missing" epochs the bridged pressure): zwd_m = ztd_m − zhd_m */
                    zhd_m?: number;
                    /** @description Weighted mean temperature, Bevis et al. (1992) [K] (with met) */
                    tm_k?: number;
                    /** @description Precipitable water vapour [mm] (with met) */
                    pwv_mm?: number;
                    /** @description Standard deviation of pwv_mm from the formal error of δw [mm] */
                    pwv_sigma_mm?: number;
                    /** @description Standard deviation of pwv_mm including the Tm regression uncertainty (4.74 K) [mm] */
                    pwv_total_sigma_mm?: number;
                  }[]
                | {
                    epoch?: string;
                    /** @description δw interpolated between the adjacent nodes [m] */
                    correction_m?: number;
                    /** @description ZWD = ztd_m − ZHD, one meaning at every epoch [m]: with met in the request, ZHD is the Saastamoinen ZHD of the surface pressure (interpolated within met_max_gap_s; across longer gaps bridged linearly, held from the nearest record beyond the records: zhd_source "met-bridged"); without met, the a-priori ZHD (zhd_source "apriori"). Continuous wherever ztd_m is */
                    zwd_m?: number;
                    /**
                     * @description Where the ZHD behind zwd_m comes from: met (measured or interpolated pressure), met-bridged (an epoch without met), apriori (a request without met)
                     * @enum {string}
                     */
                    zhd_source?: 'met' | 'met-bridged' | 'apriori';
                    /** @description Formal standard deviation of δw (with the covariance of the adjacent nodes) [m] */
                    sigma_m?: number;
                    /** @description G_N at the epoch [m]; null when gradients are off */
                    north_gradient_m?: number | null;
                    /** @description G_E at the epoch [m]; null when gradients are off */
                    east_gradient_m?: number | null;
                    north_gradient_sigma_m?: number | null;
                    east_gradient_sigma_m?: number | null;
                    /** @description Estimated epoch bias [m]; null when epoch_bias is off or all observations of the epoch were rejected */
                    epoch_bias_m?: number | null;
                    /** @description Observations of the epoch used in the final solution */
                    observations?: number;
                    /** @description A-priori ZHD + a-priori ZWD + δw [m] */
                    ztd_m?: number;
                    /**
                     * @description Met at this epoch: measured, interpolated or missing (only with met); "missing" epochs have no PWV and a bridged ZHD
                     * @enum {string}
                     */
                    met?: 'measured' | 'interpolated' | 'missing';
                    /** @description Saastamoinen ZHD of the surface pressure [m] (with met; at "missing" epochs the bridged pressure): zwd_m = ztd_m − zhd_m */
                    zhd_m?: number;
                    /** @description Weighted mean temperature, Bevis et al. (1992) [K] (with met) */
                    tm_k?: number;
                    /** @description Precipitable water vapour [mm] (with met) */
                    pwv_mm?: number;
                    /** @description Standard deviation of pwv_mm from the formal error of δw [mm] */
                    pwv_sigma_mm?: number;
                    /** @description Standard deviation of pwv_mm including the Tm regression uncertainty (4.74 K) [mm] */
                    pwv_total_sigma_mm?: number;
                  }[]
                | {
                    [key: string]: (number | string | null)[];
                  };
              /** @description Observations rejected by the screening. shape=rows: one object per row (with `fields`: the selected fields); shape=columns: one array per field, rounded to the documented precision (delays 1e-6 m, PWV 1e-4 mm, Tm 1e-4 K), null where a row has no value */
              rejected:
                | {
                    /** @description Index of the observation in the request (data row for CSV, 0-based) */
                    index: number;
                    epoch: string;
                    satellite: string;
                    /** @description The residual as sent [m] */
                    residual_m: number;
                    /** @description Post-fit residual when it was rejected [m] */
                    fitted_residual_m: number;
                    /** @description Pope τ = v/(σ̂0 σ_v) when it was rejected (signed) */
                    normalized_residual: number;
                  }[]
                | {
                    /** @description Index of the observation in the request (data row for CSV, 0-based) */
                    index?: number;
                    epoch?: string;
                    satellite?: string;
                    /** @description The residual as sent [m] */
                    residual_m?: number;
                    /** @description Post-fit residual when it was rejected [m] */
                    fitted_residual_m?: number;
                    /** @description Pope τ = v/(σ̂0 σ_v) when it was rejected (signed) */
                    normalized_residual?: number;
                  }[]
                | {
                    [key: string]: (number | string | null)[];
                  };
              statistics: {
                observations_total: number;
                /** @description Dropped for elevation below elevation_cutoff_deg (not errors) */
                observations_below_cutoff: number;
                observations_used: number;
                observations_rejected: number;
                epochs: number;
                zwd_nodes: number;
                gradient_nodes: number;
                /** @description Node values plus one bias per epoch (epoch_bias) */
                unknowns: number;
                /** @description Random-walk and a-priori pseudo-observations */
                constraints: number;
                /** @description observations_used + constraints − unknowns */
                degrees_of_freedom: number;
                /** @description RMS of the post-fit residuals [m] */
                rms_m: number;
                /** @description (vᵀPv + constraint terms) / degrees_of_freedom; null when that is 0 */
                variance_factor: number | null;
                /** @description 1: the variance factor re-weights the observations (scale_sigmas), the formal errors are not multiplied */
                sigma_scale: number;
                /** @description Least-squares solutions computed (re-weightings and screening) */
                solutions: number;
                /** @description false when max_rejections stopped the screening */
                screening_complete: boolean;
                /** @description a of σ² = a² + b²/sin²e in the final solution (re-estimated with scale_sigmas) [m] */
                weighting_constant_m: number;
                /** @description b of σ² = a² + b²/sin²e in the final solution [m] */
                weighting_elevation_m: number;
                /** @description Residuals and rejections per elevation band */
                elevation_bands: {
                  lower_deg: number;
                  upper_deg: number;
                  observations_used: number;
                  observations_rejected: number;
                  /** @description RMS of the post-fit residuals of the band [m] */
                  rms_m: number | null;
                  /** @description RMS of v/σ_v (≈ 1 when the weights fit the band) */
                  normalised_rms: number | null;
                }[];
                /** @description Time correlation of the residuals and its effect on the formal errors; null when correlated_noise is off */
                noise_correlation: {
                  sampling_s: number;
                  /** @description ρ(1), ρ(2), … of the normalised residuals per satellite arc, up to the first insignificant lag */
                  autocorrelation: number[];
                  /** @description Mean factor on the ZWD variances */
                  zwd_variance_inflation: number;
                  /** @description Mean factor on the gradient variances */
                  gradient_variance_inflation: number;
                } | null;
                zwd_nodes_without_data: number;
                gradient_nodes_without_data: number;
              };
              apriori: {
                /** @description A-priori ZHD used for ztd_m [m] */
                zhd_m: number;
                /** @description A-priori ZWD used [m] */
                zwd_m: number;
                /** @enum {string} */
                zhd_source: 'caller' | 'standard-atmosphere';
              };
              /** @description EGM96 geoid undulation N at the site [m]: the standard atmosphere of the default a-priori ZHD and the mapping function get height_m − N */
              geoid_undulation_m: number;
              /** @description The models and settings that produced this result */
              models: {
                [key: string]: string | number | boolean | null;
              };
              /** @description Short hash of `models`: results are homogeneous only when it is equal */
              model_fingerprint: string;
              /** @description Values defaulted or extrapolated, elevations below 3°, and similar */
              warnings: string[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        413: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        415: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        422: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/network-estimates': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /**
     * ZWD and gradients of several stations estimated jointly, with the clocks pre-eliminated
     * @description Per observation r = m_w(e) δw_a(t) + m_g(e) [cos A G_N,a(t) + sin A G_E,a(t)] + ρ_a(t) + σ_k(t) + ε: ZWD and gradients per station with the random-walk model of POST /v1/zwd-estimates; with satellite_clocks "estimated" on piecewise-linear nodes (at most 300 s for ZWD and 1 800 s for gradients, dividing the output spacing; the requested spacing with parametrisation "nodes"), the variance of the random walk between and on the nodes in every σ, named in models.estimator; one receiver clock ρ per station and epoch and, with satellite_clocks "estimated", one clock σ per satellite and epoch, both pre-eliminated epoch by epoch (equivalent to double differences with their full covariance; one datum clock per connected group and epoch). With satellite_clocks "known" (point positioning) every station is solved alone, as by POST /v1/zwd-estimates. Per station: the series of POST /v1/zwd-estimates (sigma_m: σ of the absolute ZWD) plus relative_sigma_m, σ relative to the reference station; with met records of the station (met[], each naming its station) also ZHD from the pressure, ZWD = ZTD − ZHD, Tm and PWV with its σ per epoch, as POST /v1/zwd-estimates does (pressure bridged across met gaps; zhd_source met | met-bridged | apriori). common_mode: σ of the network-mean ZWD with the clocks estimated and known, its correlation with the clocks, the extent in km and in nadir angle; a warning when the absolute level is not determined to options.common_mode_sigma_threshold_m. Satellites seen by one station at an epoch and epochs with one station carry no information with the clocks estimated: dropped and counted. Bodies: application/json (this schema; observations as an array of objects or as column arrays with a station column, met as records naming their station); application/vnd.apache.arrow.stream (the observations as an Arrow IPC table with a station column, the rest of the request as JSON in the schema metadata "request"); or text/csv: a table with the header row station,epoch,satellite,elevation_deg,azimuth_deg,residual_m[,sigma_m], the stations as query parameters station=ID,latitude_deg,longitude_deg,height_m[,apriori_zhd_m[,apriori_zwd_m]] (once per station) and the options as query parameters (those of POST /v1/zwd-estimates plus satellite_clocks, reference_station, common_mode_sigma_threshold_m); a text/csv request carries no met (as with POST /v1/zwd-estimates). All forms give the same answer. Limits, checked before any work: up to 100 stations and 900000 observations, and stations × observations at most 5000000 (413 naming observations and saying how much fits; a 10-station day of 30-s data fits, as text/csv of about 31 MB or JSON of about 67 MB); the answer's output nodes over all stations within the estimation's answer cap (422). Body limit 100663296 bytes. Networks too large for one body go through the archive: residual deposits per station-day (PUT /v1/stations/{station_id}/residuals/{day}) and POST /v1/network/days/{day}/zwd-estimates.
     */
    post: {
      parameters: {
        query?: {
          /** @description A station of a text/csv request, repeated once per station: "ID,latitude_deg,longitude_deg,height_m[,apriori_zhd_m[,apriori_zwd_m]]" (POST /v1/network-estimates) or "ID[,apriori_zhd_m[,apriori_zwd_m]]" (the storing route, whose sites come from the archive); an empty a-priori field = not given */
          station?: string | string[];
          /** @description Spacing Δ of the ZWD nodes of the output, on round UTC epochs jΔ (multiples of Δ since 1970-01-01T00:00Z); with parametrisation "nodes" also the spacing of the piecewise-linear model [s], (0, 2592000] s */
          zwd_interval_s?: number;
          /** @description Random-walk density q of the ZWD: consecutive states x_{j+1} − x_j = 0 ± q √(Δt/1 h) (states at every epoch, or nodes) [m/√h], (0, 10] m/√h; null = no constraint */
          zwd_random_walk_m_per_sqrt_h?: number | null;
          /** @description A-priori constraint on the first ZWD node, x_0 = 0 ± σ [m], (0, 10] m; null = none */
          zwd_apriori_sigma_m?: number | null;
          /** @description Spacing of the gradient nodes of the output (round UTC epochs; with parametrisation "nodes" the model's nodes) [s], (0, 2592000] s */
          gradient_interval_s?: number;
          /** @description Random-walk density q of each gradient component: consecutive states x_{j+1} − x_j = 0 ± q √(Δt/1 h) [m/√h], (0, 10] m/√h; null = no constraint */
          gradient_random_walk_m_per_sqrt_h?: number | null;
          /** @description A-priori constraint on the first gradient node, x_0 = 0 ± σ [m], (0, 1] m; null = none */
          gradient_apriori_sigma_m?: number | null;
          /** @description Estimate one free bias per epoch (receiver clock and other common terms); pre-eliminated */
          epoch_bias?: boolean;
          /** @description σ_i of observations without sigma_m, σ² = a² + b²/sin²e: "elevation" b = sigma0_m, a = 0; "uniform" a = sigma0_m, b = 0; "elevation-components" b = sigma0_m and a = sigma_constant_m (both re-estimated with scale_sigmas); one of elevation, uniform, elevation-components */
          weighting?: 'elevation' | 'uniform' | 'elevation-components';
          /** @description σ0 of the weighting scheme (zenith standard deviation of a residual) [m], (0, 1] m */
          sigma0_m?: number;
          /** @description Observations below this elevation are dropped (and counted) [deg], [0, 90) deg */
          elevation_cutoff_deg?: number;
          /** @description Reject while the largest |normalised residual| (Pope τ = v/(σ̂0 σ_v)) exceeds k [], [2, 1000]; null = no screening */
          outlier_threshold?: number | null;
          /** @description one-per-solution: reject the largest τ > k, re-solve, repeat. one-per-window: in each iteration also reject the largest τ > k of every stretch more than a window away from the others (nodes: max(3 ZWD intervals, 30 min); every-epoch: the smoother kernel length, 5–30 min; same result at a cost linear in the span); one of one-per-window, one-per-solution */
          outlier_rejection?: 'one-per-window' | 'one-per-solution';
          /** @description Screening stops after this many rejections, with a warning [], [0, 100000] */
          max_rejections?: number;
          /** @description Re-estimate the observation weights from the residuals (variance components: σ0, or a and b of "elevation-components") and solve again; the random-walk and a-priori constraints keep their sigmas. false = the weights as given */
          scale_sigmas?: boolean;
          /** @description a of weighting "elevation-components" (σ² = a² + b²/sin²e), the starting value when scale_sigmas re-estimates it; ignored by the other schemes [m], [0, 1] m; null = sigma0_m / 3 */
          sigma_constant_m?: number | null;
          /** @description every-epoch: a random-walk state of ZWD and gradients at every epoch, nodes interpolated with the Brownian-bridge variance (formal errors hold at any node spacing). nodes: piecewise linear between the nodes (the variation between nodes is not in σ); one of every-epoch, nodes */
          parametrisation?: 'every-epoch' | 'nodes';
          /** @description Estimate the residuals' time correlation per satellite arc and inflate the formal errors by it (docs/zwd-estimation.md, "Formal errors") */
          correlated_noise?: boolean;
          /** @description Wet mapping function of the estimator (src/domain/mapping registry). vmf1 needs per-epoch coefficients in the JSON body's vmf1_coefficients [{epoch, a_h, a_w}], interpolated linearly in time and spanning every observation epoch (a text/csv request cannot carry them); one of niell, vmf1, chao, cosecant */
          wet_mapping?: 'niell' | 'vmf1' | 'chao' | 'cosecant';
          /** @description Longest gap between met records that is interpolated across (the same setting as met_max_gap_s of the station PWV route) [s], (0, 86400] s */
          met_max_gap_s?: number;
          /** @description Estimate gradients (on) or not (off) */
          gradients?: 'on' | 'off';
          /** @description estimated: a clock per satellite and epoch, pre-eliminated (the network solution; only ZWD differences are well determined in a small network); known: the residuals were formed with satellite clocks of a global solution (point positioning: independent single-station solutions) */
          satellite_clocks?: 'estimated' | 'known';
          /** @description Station the relative ZWD (relative_sigma_m) refers to; null = the station nearest the network centroid */
          reference_station?: string | null;
          /** @description A warning (absolute-level-poorly-determined) is given when σ of the network-mean ZWD (median over epochs) exceeds this [m], (0, 1]; default 0.005 */
          common_mode_sigma_threshold_m?: number;
        };
        header?: never;
        path?: never;
        cookie?: never;
      };
      requestBody: {
        content: {
          'application/json': {
            /** @description The stations: id, site and optional a-priori delays */
            stations: {
              /** @description Station id: 1-32 characters of letters, digits, "-" and "_"; observations[].station refers to it */
              id: string;
              /** @description Site: geodetic coordinates on WGS84 */
              site: {
                /** @description Geodetic latitude [deg], [-90, 90] deg */
                latitude_deg: number;
                /** @description Longitude, east positive [deg], [-180, 360] deg */
                longitude_deg: number;
                /** @description Height above the WGS84 ellipsoid [m], [-500, 9000] m */
                height_m: number;
              };
              /** @description The a-priori zenith delays the residuals were formed with */
              apriori?: {
                /** @description ZHD the residuals were formed with; default: Saastamoinen ZHD of the standard atmosphere at the site [m], [1, 3] m */
                zhd_m?: number;
                /** @description ZWD the residuals were formed with; default 0 [m], [0, 1] m */
                zwd_m?: number;
              };
            }[];
            /** @description Zero-difference residuals of all stations, in any order: an array of objects, or an object of column arrays (as POST /v1/zwd-estimates, plus a station column) */
            observations:
              | {
                  /**
                   * Format: date-time
                   * @description Epoch, ISO 8601 date-time (UTC, e.g. 2026-03-14T12:00:00Z; an offset is converted to UTC)
                   */
                  epoch: string;
                  /** @description Satellite identifier; each (epoch, satellite) pair may appear once */
                  satellite: string;
                  /** @description Vacuum (geometric) elevation angle; below 3° the answer carries a warning; mapping functions refuse elevations below 1° (a profile is still traced there) [deg], (0, 90] deg */
                  elevation_deg: number;
                  /** @description Azimuth from north through east [deg], [0, 360] deg */
                  azimuth_deg: number;
                  /** @description Residual formed with the a-priori troposphere (observed − computed); may contain a receiver clock [m], [-1000000, 1000000] m */
                  residual_m: number;
                  /** @description Standard deviation of residual_m; absent = from options.weighting and sigma0_m [m], > 0, at most 10 */
                  sigma_m?: number;
                  /** @description Station of the observation: one of stations[].id */
                  station: string;
                }[]
              | {
                  epoch: string[];
                  satellite: string[];
                  elevation_deg: number[];
                  azimuth_deg: number[];
                  residual_m: number[];
                  sigma_m: number[];
                  station: string[];
                };
            /** @description Surface met at the stations' site heights, each record naming its station, in any order (at most 100000 records over all stations): per station as `met` of POST /v1/zwd-estimates (interpolated linearly within options.met_max_gap_s, the pressure bridged across longer gaps), giving that station's series ZHD, ZWD = ZTD − ZHD, Tm and PWV per epoch. A station without records gets zhd_source "apriori" */
            met?: {
              /**
               * Format: date-time
               * @description Epoch, ISO 8601 date-time (UTC, e.g. 2026-03-14T12:00:00Z; an offset is converted to UTC)
               */
              epoch: string;
              /** @description Measured surface pressure at the site height [hPa], [300, 1100] hPa */
              pressure_hpa: number;
              /** @description Measured surface temperature at the site height [°C], [-90, 60] °C */
              temperature_c: number;
              /** @description Relative humidity [%], 0..100; accepted, not needed for PWV */
              relative_humidity_pct?: number;
              /** @description Station of the record: one of stations[].id */
              station: string;
            }[];
            /**
             * @description Estimation options: those of POST /v1/zwd-estimates (docs/zwd-estimation.md) plus satellite_clocks, reference_station and common_mode_sigma_threshold_m
             * @default {}
             */
            options?: {
              /**
               * @description Spacing Δ of the ZWD nodes of the output, on round UTC epochs jΔ (multiples of Δ since 1970-01-01T00:00Z); with parametrisation "nodes" also the spacing of the piecewise-linear model [s], (0, 2592000] s
               * @default 300
               */
              zwd_interval_s?: number;
              /**
               * @description Random-walk density q of the ZWD: consecutive states x_{j+1} − x_j = 0 ± q √(Δt/1 h) (states at every epoch, or nodes) [m/√h], (0, 10] m/√h; null = no constraint
               * @default 0.01
               */
              zwd_random_walk_m_per_sqrt_h?: number | null;
              /**
               * @description A-priori constraint on the first ZWD node, x_0 = 0 ± σ [m], (0, 10] m; null = none
               * @default 0.5
               */
              zwd_apriori_sigma_m?: number | null;
              /**
               * @description Estimate one free bias per epoch (receiver clock and other common terms); pre-eliminated
               * @default true
               */
              epoch_bias?: boolean;
              /**
               * @description σ_i of observations without sigma_m, σ² = a² + b²/sin²e: "elevation" b = sigma0_m, a = 0; "uniform" a = sigma0_m, b = 0; "elevation-components" b = sigma0_m and a = sigma_constant_m (both re-estimated with scale_sigmas); one of elevation, uniform, elevation-components
               * @default elevation
               * @enum {string}
               */
              weighting?: 'elevation' | 'uniform' | 'elevation-components';
              /**
               * @description σ0 of the weighting scheme (zenith standard deviation of a residual) [m], (0, 1] m
               * @default 0.003
               */
              sigma0_m?: number;
              /**
               * @description Observations below this elevation are dropped (and counted) [deg], [0, 90) deg
               * @default 7
               */
              elevation_cutoff_deg?: number;
              /**
               * @description Reject while the largest |normalised residual| (Pope τ = v/(σ̂0 σ_v)) exceeds k [], [2, 1000]; null = no screening
               * @default 4
               */
              outlier_threshold?: number | null;
              /**
               * @description one-per-solution: reject the largest τ > k, re-solve, repeat. one-per-window: in each iteration also reject the largest τ > k of every stretch more than a window away from the others (nodes: max(3 ZWD intervals, 30 min); every-epoch: the smoother kernel length, 5–30 min; same result at a cost linear in the span); one of one-per-window, one-per-solution
               * @default one-per-window
               * @enum {string}
               */
              outlier_rejection?: 'one-per-window' | 'one-per-solution';
              /**
               * @description Screening stops after this many rejections, with a warning [], [0, 100000]
               * @default 1000
               */
              max_rejections?: number;
              /**
               * @description Re-estimate the observation weights from the residuals (variance components: σ0, or a and b of "elevation-components") and solve again; the random-walk and a-priori constraints keep their sigmas. false = the weights as given
               * @default true
               */
              scale_sigmas?: boolean;
              /**
               * @description a of weighting "elevation-components" (σ² = a² + b²/sin²e), the starting value when scale_sigmas re-estimates it; ignored by the other schemes [m], [0, 1] m; null = sigma0_m / 3
               * @default null
               */
              sigma_constant_m?: number | null;
              /**
               * @description every-epoch: a random-walk state of ZWD and gradients at every epoch, nodes interpolated with the Brownian-bridge variance (formal errors hold at any node spacing). nodes: piecewise linear between the nodes (the variation between nodes is not in σ); one of every-epoch, nodes
               * @default every-epoch
               * @enum {string}
               */
              parametrisation?: 'every-epoch' | 'nodes';
              /**
               * @description Estimate the residuals' time correlation per satellite arc and inflate the formal errors by it (docs/zwd-estimation.md, "Formal errors")
               * @default true
               */
              correlated_noise?: boolean;
              /**
               * @description Wet mapping function of the estimator (src/domain/mapping registry). vmf1 needs per-epoch coefficients in the JSON body's vmf1_coefficients [{epoch, a_h, a_w}], interpolated linearly in time and spanning every observation epoch (a text/csv request cannot carry them); one of niell, vmf1, chao, cosecant
               * @default niell
               * @enum {string}
               */
              wet_mapping?: 'niell' | 'vmf1' | 'chao' | 'cosecant';
              /**
               * @description Longest gap between met records that is interpolated across (the same setting as met_max_gap_s of the station PWV route) [s], (0, 86400] s
               * @default 10800
               */
              met_max_gap_s?: number;
              /** @default {} */
              gradients?: {
                /**
                 * @description Spacing of the gradient nodes of the output (round UTC epochs; with parametrisation "nodes" the model's nodes) [s], (0, 2592000] s
                 * @default 21600
                 */
                interval_s?: number;
                /**
                 * @description Random-walk density q of each gradient component: consecutive states x_{j+1} − x_j = 0 ± q √(Δt/1 h) [m/√h], (0, 10] m/√h; null = no constraint
                 * @default 0.001
                 */
                random_walk_m_per_sqrt_h?: number | null;
                /**
                 * @description A-priori constraint on the first gradient node, x_0 = 0 ± σ [m], (0, 1] m; null = none
                 * @default 0.01
                 */
                apriori_sigma_m?: number | null;
              } | null;
              /**
               * @description estimated: a clock per satellite and epoch, pre-eliminated (the network solution; only ZWD differences are well determined in a small network); known: the residuals were formed with satellite clocks of a global solution (point positioning: independent single-station solutions)
               * @default estimated
               * @enum {string}
               */
              satellite_clocks?: 'estimated' | 'known';
              /**
               * @description Station the relative ZWD (relative_sigma_m) refers to; null = the station nearest the network centroid
               * @default null
               */
              reference_station?: string | null;
              /**
               * @description A warning (absolute-level-poorly-determined) is given when σ of the network-mean ZWD (median over epochs) exceeds this [m], (0, 1]; default 0.005
               * @default 0.005
               */
              common_mode_sigma_threshold_m?: number;
            };
          };
        };
      };
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              /** @description Station the relative sigmas refer to */
              reference_station: string;
              /**
               * @description How the satellite clocks were treated (a one-station network: known)
               * @enum {string}
               */
              satellite_clocks: 'estimated' | 'known';
              /** @description One per station, in the order of the request */
              stations: {
                station: string;
                zwd_nodes: {
                  /** @description Node epoch jΔ on round UTC epochs */
                  epoch: string;
                  /** @description Estimated correction δw to the a-priori ZWD [m] */
                  correction_m: number;
                  /** @description A-priori ZWD + correction [m] (the nodes carry no met: series[].zwd_m is ztd_m − the ZHD of its zhd_source) */
                  zwd_m: number;
                  /** @description Formal standard deviation [m] (with the Brownian-bridge variance between epochs and the correlated-noise factor) */
                  sigma_m: number;
                  /** @description Used observations within one interval of the node; 0 = the value comes from the random walk alone (a node without data) */
                  observations_nearby: number;
                  /** @description σ of the value minus the reference station's [m]; 0 for the reference; null when the reference has no value then */
                  relative_sigma_m: number | null;
                }[];
                /** @description Empty when gradients are off */
                gradient_nodes: {
                  epoch: string;
                  /** @description North gradient G_N [m] */
                  north_m: number;
                  /** @description East gradient G_E [m] */
                  east_m: number;
                  north_sigma_m: number;
                  east_sigma_m: number;
                  /** @description Used observations within one interval of the node; 0 = a node without data */
                  observations_nearby: number;
                }[];
                /** @description One entry per epoch of the station (the single-station series; sigma_m is σ of the absolute ZWD) */
                series: {
                  epoch: string;
                  /** @description δw interpolated between the adjacent nodes [m] */
                  correction_m: number;
                  /** @description ZWD = ztd_m − ZHD, one meaning at every epoch [m]: with met in the request, ZHD is the Saastamoinen ZHD of the surface pressure (interpolated within met_max_gap_s; across longer gaps bridged linearly, held from the nearest record beyond the records: zhd_source "met-bridged"); without met, the a-priori ZHD (zhd_source "apriori"). Continuous wherever ztd_m is */
                  zwd_m: number;
                  /**
                   * @description Where the ZHD behind zwd_m comes from: met (measured or interpolated pressure), met-bridged (an epoch without met), apriori (a request without met)
                   * @enum {string}
                   */
                  zhd_source: 'met' | 'met-bridged' | 'apriori';
                  /** @description Formal standard deviation of δw (with the covariance of the adjacent nodes) [m] */
                  sigma_m: number;
                  /** @description G_N at the epoch [m]; null when gradients are off */
                  north_gradient_m: number | null;
                  /** @description G_E at the epoch [m]; null when gradients are off */
                  east_gradient_m: number | null;
                  north_gradient_sigma_m: number | null;
                  east_gradient_sigma_m: number | null;
                  /** @description Estimated epoch bias [m]; null when epoch_bias is off or all observations of the epoch were rejected */
                  epoch_bias_m: number | null;
                  /** @description Observations of the epoch used in the final solution */
                  observations: number;
                  /** @description A-priori ZHD + a-priori ZWD + δw [m] */
                  ztd_m: number;
                  /**
                   * @description Met at this epoch: measured, interpolated or missing (only with met); "missing" epochs have no PWV and a bridged ZHD
                   * @enum {string}
                   */
                  met?: 'measured' | 'interpolated' | 'missing';
                  /** @description Saastamoinen ZHD of the surface pressure [m] (with met; at "missing" epochs the bridged pressure): zwd_m = ztd_m − zhd_m */
                  zhd_m?: number;
                  /** @description Weighted mean temperature, Bevis et al. (1992) [K] (with met) */
                  tm_k?: number;
                  /** @description Precipitable water vapour [mm] (with met) */
                  pwv_mm?: number;
                  /** @description Standard deviation of pwv_mm from the formal error of δw [mm] */
                  pwv_sigma_mm?: number;
                  /** @description Standard deviation of pwv_mm including the Tm regression uncertainty (4.74 K) [mm] */
                  pwv_total_sigma_mm?: number;
                  /** @description σ of the value minus the reference station's [m]; 0 for the reference; null when the reference has no value then */
                  relative_sigma_m: number | null;
                }[];
                /** @description index: the observation in the request (data row for CSV, 0-based) */
                rejected: {
                  /** @description Index of the observation in the request (data row for CSV, 0-based) */
                  index: number;
                  epoch: string;
                  satellite: string;
                  /** @description The residual as sent [m] */
                  residual_m: number;
                  /** @description Post-fit residual when it was rejected [m] */
                  fitted_residual_m: number;
                  /** @description Pope τ = v/(σ̂0 σ_v) when it was rejected (signed) */
                  normalized_residual: number;
                }[];
                statistics: {
                  observations_total: number;
                  observations_below_cutoff: number;
                  /** @description Observations of a satellite no other station saw at that epoch: no information on its clock, not used */
                  observations_single_station_satellite: number;
                  observations_used: number;
                  observations_rejected: number;
                  epochs: number;
                };
                /** @description Median over the epochs of σ of the absolute ZWD [m] */
                sigma_m: number | null;
                /** @description Median over the epochs of σ of the ZWD relative to the reference station [m] */
                relative_sigma_m: number | null;
                apriori: {
                  /** @description A-priori ZHD used for ztd_m [m] */
                  zhd_m: number;
                  /** @description A-priori ZWD used [m] */
                  zwd_m: number;
                  /** @enum {string} */
                  zhd_source: 'caller' | 'standard-atmosphere';
                };
              }[];
              /** @description What the network can see of the common mode (the network-mean ZWD) */
              common_mode: {
                /** @description σ of the network-mean ZWD with the satellite clocks estimated (median over epochs) [m]; null when they were known */
                mean_zwd_sigma_clocks_estimated_m: number | null;
                /** @description The same with the satellite clocks known (independent stations) [m] */
                mean_zwd_sigma_clocks_known_m: number | null;
                /** @description Correlation of the network-mean ZWD with the mean clock term of the epoch (median); near ±1 when the clocks absorb the common mode */
                correlation_with_clocks: number | null;
                /** @description Largest distance between two stations (chord) [km] */
                extent_km: number;
                /** @description Largest angle between two stations seen from a GNSS satellite 20 200 km above the centroid [deg] */
                extent_nadir_deg: number;
              };
              statistics: {
                stations: number;
                epochs: number;
                observations_total: number;
                observations_used: number;
                observations_rejected: number;
                /** @description Dropped: their satellite was seen by one station only at that epoch */
                observations_single_station_satellite: number;
                /** @description (epoch, satellite) pairs dropped for that reason */
                single_station_satellites: number;
                /** @description Epochs with observations of one station only (no information with satellite clocks estimated) */
                single_station_epochs: number;
                unknowns: number;
                clock_unknowns: number;
                constraints: number;
                degrees_of_freedom: number;
                rms_m: number | null;
                variance_factor: number | null;
                /** @description Factor on the formal errors (√variance factor with scale_sigmas); null when it differs per station */
                sigma_scale: number | null;
                solutions: number;
                screening_complete: boolean;
              };
              /** @description The models and settings that produced this result */
              models: {
                [key: string]: string | number | boolean | null;
              };
              /** @description Short hash of `models`: results are homogeneous only when it is equal */
              model_fingerprint: string;
              /** @description Values defaulted or extrapolated, elevations below 3°, and similar */
              warnings: string[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        413: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        415: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        422: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/network/zwd-estimates': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /**
     * Estimate ZWD jointly for archive stations and store every station's series
     * @description The estimation of POST /v1/network-estimates for stations of the archive: `stations` name archive stations (id, optional apriori; no site: the stored coordinates are the sites; a station not in the archive is a 404 naming stations.N.id). text/csv: station=ID[,apriori_zhd_m[,apriori_zwd_m]] once per station. JSON and Arrow bodies as for POST /v1/network-estimates. Every station's series is stored as its delay series under ?source= (default "network-estimates") and the result's model_fingerprint, all stations in one transaction: all or nothing; per epoch the values POST /v1/stations/{id}/zwd-estimates stores for the same data and met (zwd_m = ZTD − ZHD of the station's met). A station's met: its records in the request's met[]; for a station without records there, its stored met series (records with pressure and temperature, reduced from met_height_m to the antenna height) from 1 day before the first to 1 day after the last observation of the request, read as that route reads it (a span beyond the maximum read range, or more than MAX_MET_RECORDS stored records for all such stations together, is a 400 naming observations); else the a-priori ZHD. stored[].met_used says which (request | archive | none); text/csv requests use the stored met. A station whose estimated ZTD falls outside the range a direct deposit accepts makes the whole request a 422 and nothing is stored. Per observation r = m_w(e) δw_a(t) + m_g(e) [cos A G_N,a(t) + sin A G_E,a(t)] + ρ_a(t) + σ_k(t) + ε: ZWD and gradients per station with the random-walk model of POST /v1/zwd-estimates; with satellite_clocks "estimated" on piecewise-linear nodes (at most 300 s for ZWD and 1 800 s for gradients, dividing the output spacing; the requested spacing with parametrisation "nodes"), the variance of the random walk between and on the nodes in every σ, named in models.estimator; one receiver clock ρ per station and epoch and, with satellite_clocks "estimated", one clock σ per satellite and epoch, both pre-eliminated epoch by epoch (equivalent to double differences with their full covariance; one datum clock per connected group and epoch). With satellite_clocks "known" (point positioning) every station is solved alone, as by POST /v1/zwd-estimates. Limits, checked before any work: up to 100 stations and 900000 observations, and stations × observations at most 5000000 (413 naming observations and saying how much fits; a 10-station day of 30-s data fits, as text/csv of about 31 MB or JSON of about 67 MB); the answer's output nodes over all stations within the estimation's answer cap (422). Body limit 100663296 bytes. Networks too large for one body go through the archive: residual deposits per station-day (PUT /v1/stations/{station_id}/residuals/{day}) and POST /v1/network/days/{day}/zwd-estimates. Writes need `Authorization: Bearer <key>`. Role needed: write. Needs `Authorization: Bearer <key>` of role write or admin (401 without a key, 403 with a key of role read or one not accepted).
     */
    post: {
      parameters: {
        query?: {
          /** @description A station of a text/csv request, repeated once per station: "ID,latitude_deg,longitude_deg,height_m[,apriori_zhd_m[,apriori_zwd_m]]" (POST /v1/network-estimates) or "ID[,apriori_zhd_m[,apriori_zwd_m]]" (the storing route, whose sites come from the archive); an empty a-priori field = not given */
          station?: string | string[];
          /** @description Spacing Δ of the ZWD nodes of the output, on round UTC epochs jΔ (multiples of Δ since 1970-01-01T00:00Z); with parametrisation "nodes" also the spacing of the piecewise-linear model [s], (0, 2592000] s */
          zwd_interval_s?: number;
          /** @description Random-walk density q of the ZWD: consecutive states x_{j+1} − x_j = 0 ± q √(Δt/1 h) (states at every epoch, or nodes) [m/√h], (0, 10] m/√h; null = no constraint */
          zwd_random_walk_m_per_sqrt_h?: number | null;
          /** @description A-priori constraint on the first ZWD node, x_0 = 0 ± σ [m], (0, 10] m; null = none */
          zwd_apriori_sigma_m?: number | null;
          /** @description Spacing of the gradient nodes of the output (round UTC epochs; with parametrisation "nodes" the model's nodes) [s], (0, 2592000] s */
          gradient_interval_s?: number;
          /** @description Random-walk density q of each gradient component: consecutive states x_{j+1} − x_j = 0 ± q √(Δt/1 h) [m/√h], (0, 10] m/√h; null = no constraint */
          gradient_random_walk_m_per_sqrt_h?: number | null;
          /** @description A-priori constraint on the first gradient node, x_0 = 0 ± σ [m], (0, 1] m; null = none */
          gradient_apriori_sigma_m?: number | null;
          /** @description Estimate one free bias per epoch (receiver clock and other common terms); pre-eliminated */
          epoch_bias?: boolean;
          /** @description σ_i of observations without sigma_m, σ² = a² + b²/sin²e: "elevation" b = sigma0_m, a = 0; "uniform" a = sigma0_m, b = 0; "elevation-components" b = sigma0_m and a = sigma_constant_m (both re-estimated with scale_sigmas); one of elevation, uniform, elevation-components */
          weighting?: 'elevation' | 'uniform' | 'elevation-components';
          /** @description σ0 of the weighting scheme (zenith standard deviation of a residual) [m], (0, 1] m */
          sigma0_m?: number;
          /** @description Observations below this elevation are dropped (and counted) [deg], [0, 90) deg */
          elevation_cutoff_deg?: number;
          /** @description Reject while the largest |normalised residual| (Pope τ = v/(σ̂0 σ_v)) exceeds k [], [2, 1000]; null = no screening */
          outlier_threshold?: number | null;
          /** @description one-per-solution: reject the largest τ > k, re-solve, repeat. one-per-window: in each iteration also reject the largest τ > k of every stretch more than a window away from the others (nodes: max(3 ZWD intervals, 30 min); every-epoch: the smoother kernel length, 5–30 min; same result at a cost linear in the span); one of one-per-window, one-per-solution */
          outlier_rejection?: 'one-per-window' | 'one-per-solution';
          /** @description Screening stops after this many rejections, with a warning [], [0, 100000] */
          max_rejections?: number;
          /** @description Re-estimate the observation weights from the residuals (variance components: σ0, or a and b of "elevation-components") and solve again; the random-walk and a-priori constraints keep their sigmas. false = the weights as given */
          scale_sigmas?: boolean;
          /** @description a of weighting "elevation-components" (σ² = a² + b²/sin²e), the starting value when scale_sigmas re-estimates it; ignored by the other schemes [m], [0, 1] m; null = sigma0_m / 3 */
          sigma_constant_m?: number | null;
          /** @description every-epoch: a random-walk state of ZWD and gradients at every epoch, nodes interpolated with the Brownian-bridge variance (formal errors hold at any node spacing). nodes: piecewise linear between the nodes (the variation between nodes is not in σ); one of every-epoch, nodes */
          parametrisation?: 'every-epoch' | 'nodes';
          /** @description Estimate the residuals' time correlation per satellite arc and inflate the formal errors by it (docs/zwd-estimation.md, "Formal errors") */
          correlated_noise?: boolean;
          /** @description Wet mapping function of the estimator (src/domain/mapping registry). vmf1 needs per-epoch coefficients in the JSON body's vmf1_coefficients [{epoch, a_h, a_w}], interpolated linearly in time and spanning every observation epoch (a text/csv request cannot carry them); one of niell, vmf1, chao, cosecant */
          wet_mapping?: 'niell' | 'vmf1' | 'chao' | 'cosecant';
          /** @description Longest gap between met records that is interpolated across (the same setting as met_max_gap_s of the station PWV route) [s], (0, 86400] s */
          met_max_gap_s?: number;
          /** @description Estimate gradients (on) or not (off) */
          gradients?: 'on' | 'off';
          /** @description estimated: a clock per satellite and epoch, pre-eliminated (the network solution; only ZWD differences are well determined in a small network); known: the residuals were formed with satellite clocks of a global solution (point positioning: independent single-station solutions) */
          satellite_clocks?: 'estimated' | 'known';
          /** @description Station the relative ZWD (relative_sigma_m) refers to; null = the station nearest the network centroid */
          reference_station?: string | null;
          /** @description A warning (absolute-level-poorly-determined) is given when σ of the network-mean ZWD (median over epochs) exceeds this [m], (0, 1]; default 0.005 */
          common_mode_sigma_threshold_m?: number;
          /** @description Source under which every station's series is stored (default "network-estimates") */
          source?: string;
        };
        header?: never;
        path?: never;
        cookie?: never;
      };
      requestBody: {
        content: {
          'application/json': {
            /** @description Archive stations (their stored coordinates are the sites) and optional a-priori delays */
            stations: {
              /** @description Station id: 1-32 characters of letters, digits, "-" and "_"; observations[].station refers to it */
              id: string;
              /** @description The a-priori zenith delays the residuals were formed with */
              apriori?: {
                /** @description ZHD the residuals were formed with; default: Saastamoinen ZHD of the standard atmosphere at the site [m], [1, 3] m */
                zhd_m?: number;
                /** @description ZWD the residuals were formed with; default 0 [m], [0, 1] m */
                zwd_m?: number;
              };
            }[];
            /** @description Zero-difference residuals of all stations, in any order: an array of objects, or an object of column arrays (as POST /v1/zwd-estimates, plus a station column) */
            observations:
              | {
                  /**
                   * Format: date-time
                   * @description Epoch, ISO 8601 date-time (UTC, e.g. 2026-03-14T12:00:00Z; an offset is converted to UTC)
                   */
                  epoch: string;
                  /** @description Satellite identifier; each (epoch, satellite) pair may appear once */
                  satellite: string;
                  /** @description Vacuum (geometric) elevation angle; below 3° the answer carries a warning; mapping functions refuse elevations below 1° (a profile is still traced there) [deg], (0, 90] deg */
                  elevation_deg: number;
                  /** @description Azimuth from north through east [deg], [0, 360] deg */
                  azimuth_deg: number;
                  /** @description Residual formed with the a-priori troposphere (observed − computed); may contain a receiver clock [m], [-1000000, 1000000] m */
                  residual_m: number;
                  /** @description Standard deviation of residual_m; absent = from options.weighting and sigma0_m [m], > 0, at most 10 */
                  sigma_m?: number;
                  /** @description Station of the observation: one of stations[].id */
                  station: string;
                }[]
              | {
                  epoch: string[];
                  satellite: string[];
                  elevation_deg: number[];
                  azimuth_deg: number[];
                  residual_m: number[];
                  sigma_m: number[];
                  station: string[];
                };
            /** @description Surface met at the stations' site heights, each record naming its station, in any order (at most 100000 records over all stations): per station as `met` of POST /v1/zwd-estimates (interpolated linearly within options.met_max_gap_s, the pressure bridged across longer gaps), giving that station's series ZHD, ZWD = ZTD − ZHD, Tm and PWV per epoch. A station without records gets zhd_source "apriori" */
            met?: {
              /**
               * Format: date-time
               * @description Epoch, ISO 8601 date-time (UTC, e.g. 2026-03-14T12:00:00Z; an offset is converted to UTC)
               */
              epoch: string;
              /** @description Measured surface pressure at the site height [hPa], [300, 1100] hPa */
              pressure_hpa: number;
              /** @description Measured surface temperature at the site height [°C], [-90, 60] °C */
              temperature_c: number;
              /** @description Relative humidity [%], 0..100; accepted, not needed for PWV */
              relative_humidity_pct?: number;
              /** @description Station of the record: one of stations[].id */
              station: string;
            }[];
            /**
             * @description Estimation options: those of POST /v1/zwd-estimates (docs/zwd-estimation.md) plus satellite_clocks, reference_station and common_mode_sigma_threshold_m
             * @default {}
             */
            options?: {
              /**
               * @description Spacing Δ of the ZWD nodes of the output, on round UTC epochs jΔ (multiples of Δ since 1970-01-01T00:00Z); with parametrisation "nodes" also the spacing of the piecewise-linear model [s], (0, 2592000] s
               * @default 300
               */
              zwd_interval_s?: number;
              /**
               * @description Random-walk density q of the ZWD: consecutive states x_{j+1} − x_j = 0 ± q √(Δt/1 h) (states at every epoch, or nodes) [m/√h], (0, 10] m/√h; null = no constraint
               * @default 0.01
               */
              zwd_random_walk_m_per_sqrt_h?: number | null;
              /**
               * @description A-priori constraint on the first ZWD node, x_0 = 0 ± σ [m], (0, 10] m; null = none
               * @default 0.5
               */
              zwd_apriori_sigma_m?: number | null;
              /**
               * @description Estimate one free bias per epoch (receiver clock and other common terms); pre-eliminated
               * @default true
               */
              epoch_bias?: boolean;
              /**
               * @description σ_i of observations without sigma_m, σ² = a² + b²/sin²e: "elevation" b = sigma0_m, a = 0; "uniform" a = sigma0_m, b = 0; "elevation-components" b = sigma0_m and a = sigma_constant_m (both re-estimated with scale_sigmas); one of elevation, uniform, elevation-components
               * @default elevation
               * @enum {string}
               */
              weighting?: 'elevation' | 'uniform' | 'elevation-components';
              /**
               * @description σ0 of the weighting scheme (zenith standard deviation of a residual) [m], (0, 1] m
               * @default 0.003
               */
              sigma0_m?: number;
              /**
               * @description Observations below this elevation are dropped (and counted) [deg], [0, 90) deg
               * @default 7
               */
              elevation_cutoff_deg?: number;
              /**
               * @description Reject while the largest |normalised residual| (Pope τ = v/(σ̂0 σ_v)) exceeds k [], [2, 1000]; null = no screening
               * @default 4
               */
              outlier_threshold?: number | null;
              /**
               * @description one-per-solution: reject the largest τ > k, re-solve, repeat. one-per-window: in each iteration also reject the largest τ > k of every stretch more than a window away from the others (nodes: max(3 ZWD intervals, 30 min); every-epoch: the smoother kernel length, 5–30 min; same result at a cost linear in the span); one of one-per-window, one-per-solution
               * @default one-per-window
               * @enum {string}
               */
              outlier_rejection?: 'one-per-window' | 'one-per-solution';
              /**
               * @description Screening stops after this many rejections, with a warning [], [0, 100000]
               * @default 1000
               */
              max_rejections?: number;
              /**
               * @description Re-estimate the observation weights from the residuals (variance components: σ0, or a and b of "elevation-components") and solve again; the random-walk and a-priori constraints keep their sigmas. false = the weights as given
               * @default true
               */
              scale_sigmas?: boolean;
              /**
               * @description a of weighting "elevation-components" (σ² = a² + b²/sin²e), the starting value when scale_sigmas re-estimates it; ignored by the other schemes [m], [0, 1] m; null = sigma0_m / 3
               * @default null
               */
              sigma_constant_m?: number | null;
              /**
               * @description every-epoch: a random-walk state of ZWD and gradients at every epoch, nodes interpolated with the Brownian-bridge variance (formal errors hold at any node spacing). nodes: piecewise linear between the nodes (the variation between nodes is not in σ); one of every-epoch, nodes
               * @default every-epoch
               * @enum {string}
               */
              parametrisation?: 'every-epoch' | 'nodes';
              /**
               * @description Estimate the residuals' time correlation per satellite arc and inflate the formal errors by it (docs/zwd-estimation.md, "Formal errors")
               * @default true
               */
              correlated_noise?: boolean;
              /**
               * @description Wet mapping function of the estimator (src/domain/mapping registry). vmf1 needs per-epoch coefficients in the JSON body's vmf1_coefficients [{epoch, a_h, a_w}], interpolated linearly in time and spanning every observation epoch (a text/csv request cannot carry them); one of niell, vmf1, chao, cosecant
               * @default niell
               * @enum {string}
               */
              wet_mapping?: 'niell' | 'vmf1' | 'chao' | 'cosecant';
              /**
               * @description Longest gap between met records that is interpolated across (the same setting as met_max_gap_s of the station PWV route) [s], (0, 86400] s
               * @default 10800
               */
              met_max_gap_s?: number;
              /** @default {} */
              gradients?: {
                /**
                 * @description Spacing of the gradient nodes of the output (round UTC epochs; with parametrisation "nodes" the model's nodes) [s], (0, 2592000] s
                 * @default 21600
                 */
                interval_s?: number;
                /**
                 * @description Random-walk density q of each gradient component: consecutive states x_{j+1} − x_j = 0 ± q √(Δt/1 h) [m/√h], (0, 10] m/√h; null = no constraint
                 * @default 0.001
                 */
                random_walk_m_per_sqrt_h?: number | null;
                /**
                 * @description A-priori constraint on the first gradient node, x_0 = 0 ± σ [m], (0, 1] m; null = none
                 * @default 0.01
                 */
                apriori_sigma_m?: number | null;
              } | null;
              /**
               * @description estimated: a clock per satellite and epoch, pre-eliminated (the network solution; only ZWD differences are well determined in a small network); known: the residuals were formed with satellite clocks of a global solution (point positioning: independent single-station solutions)
               * @default estimated
               * @enum {string}
               */
              satellite_clocks?: 'estimated' | 'known';
              /**
               * @description Station the relative ZWD (relative_sigma_m) refers to; null = the station nearest the network centroid
               * @default null
               */
              reference_station?: string | null;
              /**
               * @description A warning (absolute-level-poorly-determined) is given when σ of the network-mean ZWD (median over epochs) exceeds this [m], (0, 1]; default 0.005
               * @default 0.005
               */
              common_mode_sigma_threshold_m?: number;
            };
          };
        };
      };
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              /** @description Station the relative sigmas refer to */
              reference_station: string;
              /**
               * @description How the satellite clocks were treated (a one-station network: known)
               * @enum {string}
               */
              satellite_clocks: 'estimated' | 'known';
              /** @description One per station, in the order of the request */
              stations: {
                station: string;
                zwd_nodes: {
                  /** @description Node epoch jΔ on round UTC epochs */
                  epoch: string;
                  /** @description Estimated correction δw to the a-priori ZWD [m] */
                  correction_m: number;
                  /** @description A-priori ZWD + correction [m] (the nodes carry no met: series[].zwd_m is ztd_m − the ZHD of its zhd_source) */
                  zwd_m: number;
                  /** @description Formal standard deviation [m] (with the Brownian-bridge variance between epochs and the correlated-noise factor) */
                  sigma_m: number;
                  /** @description Used observations within one interval of the node; 0 = the value comes from the random walk alone (a node without data) */
                  observations_nearby: number;
                  /** @description σ of the value minus the reference station's [m]; 0 for the reference; null when the reference has no value then */
                  relative_sigma_m: number | null;
                }[];
                /** @description Empty when gradients are off */
                gradient_nodes: {
                  epoch: string;
                  /** @description North gradient G_N [m] */
                  north_m: number;
                  /** @description East gradient G_E [m] */
                  east_m: number;
                  north_sigma_m: number;
                  east_sigma_m: number;
                  /** @description Used observations within one interval of the node; 0 = a node without data */
                  observations_nearby: number;
                }[];
                /** @description One entry per epoch of the station (the single-station series; sigma_m is σ of the absolute ZWD) */
                series: {
                  epoch: string;
                  /** @description δw interpolated between the adjacent nodes [m] */
                  correction_m: number;
                  /** @description ZWD = ztd_m − ZHD, one meaning at every epoch [m]: with met in the request, ZHD is the Saastamoinen ZHD of the surface pressure (interpolated within met_max_gap_s; across longer gaps bridged linearly, held from the nearest record beyond the records: zhd_source "met-bridged"); without met, the a-priori ZHD (zhd_source "apriori"). Continuous wherever ztd_m is */
                  zwd_m: number;
                  /**
                   * @description Where the ZHD behind zwd_m comes from: met (measured or interpolated pressure), met-bridged (an epoch without met), apriori (a request without met)
                   * @enum {string}
                   */
                  zhd_source: 'met' | 'met-bridged' | 'apriori';
                  /** @description Formal standard deviation of δw (with the covariance of the adjacent nodes) [m] */
                  sigma_m: number;
                  /** @description G_N at the epoch [m]; null when gradients are off */
                  north_gradient_m: number | null;
                  /** @description G_E at the epoch [m]; null when gradients are off */
                  east_gradient_m: number | null;
                  north_gradient_sigma_m: number | null;
                  east_gradient_sigma_m: number | null;
                  /** @description Estimated epoch bias [m]; null when epoch_bias is off or all observations of the epoch were rejected */
                  epoch_bias_m: number | null;
                  /** @description Observations of the epoch used in the final solution */
                  observations: number;
                  /** @description A-priori ZHD + a-priori ZWD + δw [m] */
                  ztd_m: number;
                  /**
                   * @description Met at this epoch: measured, interpolated or missing (only with met); "missing" epochs have no PWV and a bridged ZHD
                   * @enum {string}
                   */
                  met?: 'measured' | 'interpolated' | 'missing';
                  /** @description Saastamoinen ZHD of the surface pressure [m] (with met; at "missing" epochs the bridged pressure): zwd_m = ztd_m − zhd_m */
                  zhd_m?: number;
                  /** @description Weighted mean temperature, Bevis et al. (1992) [K] (with met) */
                  tm_k?: number;
                  /** @description Precipitable water vapour [mm] (with met) */
                  pwv_mm?: number;
                  /** @description Standard deviation of pwv_mm from the formal error of δw [mm] */
                  pwv_sigma_mm?: number;
                  /** @description Standard deviation of pwv_mm including the Tm regression uncertainty (4.74 K) [mm] */
                  pwv_total_sigma_mm?: number;
                  /** @description σ of the value minus the reference station's [m]; 0 for the reference; null when the reference has no value then */
                  relative_sigma_m: number | null;
                }[];
                /** @description index: the observation in the request (data row for CSV, 0-based) */
                rejected: {
                  /** @description Index of the observation in the request (data row for CSV, 0-based) */
                  index: number;
                  epoch: string;
                  satellite: string;
                  /** @description The residual as sent [m] */
                  residual_m: number;
                  /** @description Post-fit residual when it was rejected [m] */
                  fitted_residual_m: number;
                  /** @description Pope τ = v/(σ̂0 σ_v) when it was rejected (signed) */
                  normalized_residual: number;
                }[];
                statistics: {
                  observations_total: number;
                  observations_below_cutoff: number;
                  /** @description Observations of a satellite no other station saw at that epoch: no information on its clock, not used */
                  observations_single_station_satellite: number;
                  observations_used: number;
                  observations_rejected: number;
                  epochs: number;
                };
                /** @description Median over the epochs of σ of the absolute ZWD [m] */
                sigma_m: number | null;
                /** @description Median over the epochs of σ of the ZWD relative to the reference station [m] */
                relative_sigma_m: number | null;
                apriori: {
                  /** @description A-priori ZHD used for ztd_m [m] */
                  zhd_m: number;
                  /** @description A-priori ZWD used [m] */
                  zwd_m: number;
                  /** @enum {string} */
                  zhd_source: 'caller' | 'standard-atmosphere';
                };
              }[];
              /** @description What the network can see of the common mode (the network-mean ZWD) */
              common_mode: {
                /** @description σ of the network-mean ZWD with the satellite clocks estimated (median over epochs) [m]; null when they were known */
                mean_zwd_sigma_clocks_estimated_m: number | null;
                /** @description The same with the satellite clocks known (independent stations) [m] */
                mean_zwd_sigma_clocks_known_m: number | null;
                /** @description Correlation of the network-mean ZWD with the mean clock term of the epoch (median); near ±1 when the clocks absorb the common mode */
                correlation_with_clocks: number | null;
                /** @description Largest distance between two stations (chord) [km] */
                extent_km: number;
                /** @description Largest angle between two stations seen from a GNSS satellite 20 200 km above the centroid [deg] */
                extent_nadir_deg: number;
              };
              statistics: {
                stations: number;
                epochs: number;
                observations_total: number;
                observations_used: number;
                observations_rejected: number;
                /** @description Dropped: their satellite was seen by one station only at that epoch */
                observations_single_station_satellite: number;
                /** @description (epoch, satellite) pairs dropped for that reason */
                single_station_satellites: number;
                /** @description Epochs with observations of one station only (no information with satellite clocks estimated) */
                single_station_epochs: number;
                unknowns: number;
                clock_unknowns: number;
                constraints: number;
                degrees_of_freedom: number;
                rms_m: number | null;
                variance_factor: number | null;
                /** @description Factor on the formal errors (√variance factor with scale_sigmas); null when it differs per station */
                sigma_scale: number | null;
                solutions: number;
                screening_complete: boolean;
              };
              /** @description The models and settings that produced this result */
              models: {
                [key: string]: string | number | boolean | null;
              };
              /** @description Short hash of `models`: results are homogeneous only when it is equal */
              model_fingerprint: string;
              /** @description Values defaulted or extrapolated, elevations below 3°, and similar */
              warnings: string[];
              /** @description Per station: its series as stored in the station's delay series under this source and the result's model_fingerprint */
              stored: {
                station: string;
                source: string;
                /**
                 * @description Where the station's met came from: its records in the request's met[], its stored met series, or neither (ZHD a-priori, no PWV)
                 * @enum {string}
                 */
                met_used: 'request' | 'archive' | 'none';
                inserted: number;
                updated: number;
                unchanged: number;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        413: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        415: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        422: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/network/days/{day}/zwd-estimates': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /**
     * Estimate ZWD jointly from the stations' deposited residuals of one day and store every station's series
     * @description The estimation and storing of POST /v1/network/zwd-estimates, with the observations taken from the archive: each station in `stations` must have its residuals of the UTC day deposited (PUT /v1/stations/{station_id}/residuals/{day}); a station without a deposit is a 404 naming stations.N.id. The body holds no observations: `stations` (archive ids, optional apriori), optional `met` (records naming their station; a station without records uses its stored met) and `options` (those of POST /v1/network-estimates). Sized for networks beyond one request body: stations × observations up to 150000000 (TROPODELAY_NETWORK_DAY_MAX_STATION_OBSERVATIONS; a 50-station day of 30-s data with about 18 satellites in view is 130 M and takes about a minute of one core and 1.9 GB of memory), checked before any work: 413 naming stations. The answer and what is stored are those of POST /v1/network/zwd-estimates for the same observations. Writes need `Authorization: Bearer <key>`. Body limit: 100663296 bytes. Role needed: write. Needs `Authorization: Bearer <key>` of role write or admin (401 without a key, 403 with a key of role read or one not accepted).
     */
    post: {
      parameters: {
        query?: {
          /** @description Source under which every station's series is stored (default "network-estimates") */
          source?: string;
        };
        header?: never;
        path: {
          /** @description UTC calendar day, YYYY-MM-DD */
          day: string;
        };
        cookie?: never;
      };
      requestBody: {
        content: {
          'application/json': {
            /** @description Archive stations whose residuals of the day are deposited (their stored coordinates are the sites), and optional a-priori delays */
            stations: {
              /** @description Station id: 1-32 characters of letters, digits, "-" and "_"; observations[].station refers to it */
              id: string;
              /** @description The a-priori zenith delays the residuals were formed with */
              apriori?: {
                /** @description ZHD the residuals were formed with; default: Saastamoinen ZHD of the standard atmosphere at the site [m], [1, 3] m */
                zhd_m?: number;
                /** @description ZWD the residuals were formed with; default 0 [m], [0, 1] m */
                zwd_m?: number;
              };
            }[];
            /** @description Surface met at the stations' site heights, each record naming its station, in any order (at most 100000 records over all stations): per station as `met` of POST /v1/zwd-estimates (interpolated linearly within options.met_max_gap_s, the pressure bridged across longer gaps), giving that station's series ZHD, ZWD = ZTD − ZHD, Tm and PWV per epoch. A station without records gets zhd_source "apriori" */
            met?: {
              /**
               * Format: date-time
               * @description Epoch, ISO 8601 date-time (UTC, e.g. 2026-03-14T12:00:00Z; an offset is converted to UTC)
               */
              epoch: string;
              /** @description Measured surface pressure at the site height [hPa], [300, 1100] hPa */
              pressure_hpa: number;
              /** @description Measured surface temperature at the site height [°C], [-90, 60] °C */
              temperature_c: number;
              /** @description Relative humidity [%], 0..100; accepted, not needed for PWV */
              relative_humidity_pct?: number;
              /** @description Station of the record: one of stations[].id */
              station: string;
            }[];
            /**
             * @description Estimation options: those of POST /v1/zwd-estimates (docs/zwd-estimation.md) plus satellite_clocks, reference_station and common_mode_sigma_threshold_m
             * @default {}
             */
            options?: {
              /**
               * @description Spacing Δ of the ZWD nodes of the output, on round UTC epochs jΔ (multiples of Δ since 1970-01-01T00:00Z); with parametrisation "nodes" also the spacing of the piecewise-linear model [s], (0, 2592000] s
               * @default 300
               */
              zwd_interval_s?: number;
              /**
               * @description Random-walk density q of the ZWD: consecutive states x_{j+1} − x_j = 0 ± q √(Δt/1 h) (states at every epoch, or nodes) [m/√h], (0, 10] m/√h; null = no constraint
               * @default 0.01
               */
              zwd_random_walk_m_per_sqrt_h?: number | null;
              /**
               * @description A-priori constraint on the first ZWD node, x_0 = 0 ± σ [m], (0, 10] m; null = none
               * @default 0.5
               */
              zwd_apriori_sigma_m?: number | null;
              /**
               * @description Estimate one free bias per epoch (receiver clock and other common terms); pre-eliminated
               * @default true
               */
              epoch_bias?: boolean;
              /**
               * @description σ_i of observations without sigma_m, σ² = a² + b²/sin²e: "elevation" b = sigma0_m, a = 0; "uniform" a = sigma0_m, b = 0; "elevation-components" b = sigma0_m and a = sigma_constant_m (both re-estimated with scale_sigmas); one of elevation, uniform, elevation-components
               * @default elevation
               * @enum {string}
               */
              weighting?: 'elevation' | 'uniform' | 'elevation-components';
              /**
               * @description σ0 of the weighting scheme (zenith standard deviation of a residual) [m], (0, 1] m
               * @default 0.003
               */
              sigma0_m?: number;
              /**
               * @description Observations below this elevation are dropped (and counted) [deg], [0, 90) deg
               * @default 7
               */
              elevation_cutoff_deg?: number;
              /**
               * @description Reject while the largest |normalised residual| (Pope τ = v/(σ̂0 σ_v)) exceeds k [], [2, 1000]; null = no screening
               * @default 4
               */
              outlier_threshold?: number | null;
              /**
               * @description one-per-solution: reject the largest τ > k, re-solve, repeat. one-per-window: in each iteration also reject the largest τ > k of every stretch more than a window away from the others (nodes: max(3 ZWD intervals, 30 min); every-epoch: the smoother kernel length, 5–30 min; same result at a cost linear in the span); one of one-per-window, one-per-solution
               * @default one-per-window
               * @enum {string}
               */
              outlier_rejection?: 'one-per-window' | 'one-per-solution';
              /**
               * @description Screening stops after this many rejections, with a warning [], [0, 100000]
               * @default 1000
               */
              max_rejections?: number;
              /**
               * @description Re-estimate the observation weights from the residuals (variance components: σ0, or a and b of "elevation-components") and solve again; the random-walk and a-priori constraints keep their sigmas. false = the weights as given
               * @default true
               */
              scale_sigmas?: boolean;
              /**
               * @description a of weighting "elevation-components" (σ² = a² + b²/sin²e), the starting value when scale_sigmas re-estimates it; ignored by the other schemes [m], [0, 1] m; null = sigma0_m / 3
               * @default null
               */
              sigma_constant_m?: number | null;
              /**
               * @description every-epoch: a random-walk state of ZWD and gradients at every epoch, nodes interpolated with the Brownian-bridge variance (formal errors hold at any node spacing). nodes: piecewise linear between the nodes (the variation between nodes is not in σ); one of every-epoch, nodes
               * @default every-epoch
               * @enum {string}
               */
              parametrisation?: 'every-epoch' | 'nodes';
              /**
               * @description Estimate the residuals' time correlation per satellite arc and inflate the formal errors by it (docs/zwd-estimation.md, "Formal errors")
               * @default true
               */
              correlated_noise?: boolean;
              /**
               * @description Wet mapping function of the estimator (src/domain/mapping registry). vmf1 needs per-epoch coefficients in the JSON body's vmf1_coefficients [{epoch, a_h, a_w}], interpolated linearly in time and spanning every observation epoch (a text/csv request cannot carry them); one of niell, vmf1, chao, cosecant
               * @default niell
               * @enum {string}
               */
              wet_mapping?: 'niell' | 'vmf1' | 'chao' | 'cosecant';
              /**
               * @description Longest gap between met records that is interpolated across (the same setting as met_max_gap_s of the station PWV route) [s], (0, 86400] s
               * @default 10800
               */
              met_max_gap_s?: number;
              /** @default {} */
              gradients?: {
                /**
                 * @description Spacing of the gradient nodes of the output (round UTC epochs; with parametrisation "nodes" the model's nodes) [s], (0, 2592000] s
                 * @default 21600
                 */
                interval_s?: number;
                /**
                 * @description Random-walk density q of each gradient component: consecutive states x_{j+1} − x_j = 0 ± q √(Δt/1 h) [m/√h], (0, 10] m/√h; null = no constraint
                 * @default 0.001
                 */
                random_walk_m_per_sqrt_h?: number | null;
                /**
                 * @description A-priori constraint on the first gradient node, x_0 = 0 ± σ [m], (0, 1] m; null = none
                 * @default 0.01
                 */
                apriori_sigma_m?: number | null;
              } | null;
              /**
               * @description estimated: a clock per satellite and epoch, pre-eliminated (the network solution; only ZWD differences are well determined in a small network); known: the residuals were formed with satellite clocks of a global solution (point positioning: independent single-station solutions)
               * @default estimated
               * @enum {string}
               */
              satellite_clocks?: 'estimated' | 'known';
              /**
               * @description Station the relative ZWD (relative_sigma_m) refers to; null = the station nearest the network centroid
               * @default null
               */
              reference_station?: string | null;
              /**
               * @description A warning (absolute-level-poorly-determined) is given when σ of the network-mean ZWD (median over epochs) exceeds this [m], (0, 1]; default 0.005
               * @default 0.005
               */
              common_mode_sigma_threshold_m?: number;
            };
          };
        };
      };
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              /** @description Station the relative sigmas refer to */
              reference_station: string;
              /**
               * @description How the satellite clocks were treated (a one-station network: known)
               * @enum {string}
               */
              satellite_clocks: 'estimated' | 'known';
              /** @description One per station, in the order of the request */
              stations: {
                station: string;
                zwd_nodes: {
                  /** @description Node epoch jΔ on round UTC epochs */
                  epoch: string;
                  /** @description Estimated correction δw to the a-priori ZWD [m] */
                  correction_m: number;
                  /** @description A-priori ZWD + correction [m] (the nodes carry no met: series[].zwd_m is ztd_m − the ZHD of its zhd_source) */
                  zwd_m: number;
                  /** @description Formal standard deviation [m] (with the Brownian-bridge variance between epochs and the correlated-noise factor) */
                  sigma_m: number;
                  /** @description Used observations within one interval of the node; 0 = the value comes from the random walk alone (a node without data) */
                  observations_nearby: number;
                  /** @description σ of the value minus the reference station's [m]; 0 for the reference; null when the reference has no value then */
                  relative_sigma_m: number | null;
                }[];
                /** @description Empty when gradients are off */
                gradient_nodes: {
                  epoch: string;
                  /** @description North gradient G_N [m] */
                  north_m: number;
                  /** @description East gradient G_E [m] */
                  east_m: number;
                  north_sigma_m: number;
                  east_sigma_m: number;
                  /** @description Used observations within one interval of the node; 0 = a node without data */
                  observations_nearby: number;
                }[];
                /** @description One entry per epoch of the station (the single-station series; sigma_m is σ of the absolute ZWD) */
                series: {
                  epoch: string;
                  /** @description δw interpolated between the adjacent nodes [m] */
                  correction_m: number;
                  /** @description ZWD = ztd_m − ZHD, one meaning at every epoch [m]: with met in the request, ZHD is the Saastamoinen ZHD of the surface pressure (interpolated within met_max_gap_s; across longer gaps bridged linearly, held from the nearest record beyond the records: zhd_source "met-bridged"); without met, the a-priori ZHD (zhd_source "apriori"). Continuous wherever ztd_m is */
                  zwd_m: number;
                  /**
                   * @description Where the ZHD behind zwd_m comes from: met (measured or interpolated pressure), met-bridged (an epoch without met), apriori (a request without met)
                   * @enum {string}
                   */
                  zhd_source: 'met' | 'met-bridged' | 'apriori';
                  /** @description Formal standard deviation of δw (with the covariance of the adjacent nodes) [m] */
                  sigma_m: number;
                  /** @description G_N at the epoch [m]; null when gradients are off */
                  north_gradient_m: number | null;
                  /** @description G_E at the epoch [m]; null when gradients are off */
                  east_gradient_m: number | null;
                  north_gradient_sigma_m: number | null;
                  east_gradient_sigma_m: number | null;
                  /** @description Estimated epoch bias [m]; null when epoch_bias is off or all observations of the epoch were rejected */
                  epoch_bias_m: number | null;
                  /** @description Observations of the epoch used in the final solution */
                  observations: number;
                  /** @description A-priori ZHD + a-priori ZWD + δw [m] */
                  ztd_m: number;
                  /**
                   * @description Met at this epoch: measured, interpolated or missing (only with met); "missing" epochs have no PWV and a bridged ZHD
                   * @enum {string}
                   */
                  met?: 'measured' | 'interpolated' | 'missing';
                  /** @description Saastamoinen ZHD of the surface pressure [m] (with met; at "missing" epochs the bridged pressure): zwd_m = ztd_m − zhd_m */
                  zhd_m?: number;
                  /** @description Weighted mean temperature, Bevis et al. (1992) [K] (with met) */
                  tm_k?: number;
                  /** @description Precipitable water vapour [mm] (with met) */
                  pwv_mm?: number;
                  /** @description Standard deviation of pwv_mm from the formal error of δw [mm] */
                  pwv_sigma_mm?: number;
                  /** @description Standard deviation of pwv_mm including the Tm regression uncertainty (4.74 K) [mm] */
                  pwv_total_sigma_mm?: number;
                  /** @description σ of the value minus the reference station's [m]; 0 for the reference; null when the reference has no value then */
                  relative_sigma_m: number | null;
                }[];
                /** @description index: the observation in the request (data row for CSV, 0-based) */
                rejected: {
                  /** @description Index of the observation in the request (data row for CSV, 0-based) */
                  index: number;
                  epoch: string;
                  satellite: string;
                  /** @description The residual as sent [m] */
                  residual_m: number;
                  /** @description Post-fit residual when it was rejected [m] */
                  fitted_residual_m: number;
                  /** @description Pope τ = v/(σ̂0 σ_v) when it was rejected (signed) */
                  normalized_residual: number;
                }[];
                statistics: {
                  observations_total: number;
                  observations_below_cutoff: number;
                  /** @description Observations of a satellite no other station saw at that epoch: no information on its clock, not used */
                  observations_single_station_satellite: number;
                  observations_used: number;
                  observations_rejected: number;
                  epochs: number;
                };
                /** @description Median over the epochs of σ of the absolute ZWD [m] */
                sigma_m: number | null;
                /** @description Median over the epochs of σ of the ZWD relative to the reference station [m] */
                relative_sigma_m: number | null;
                apriori: {
                  /** @description A-priori ZHD used for ztd_m [m] */
                  zhd_m: number;
                  /** @description A-priori ZWD used [m] */
                  zwd_m: number;
                  /** @enum {string} */
                  zhd_source: 'caller' | 'standard-atmosphere';
                };
              }[];
              /** @description What the network can see of the common mode (the network-mean ZWD) */
              common_mode: {
                /** @description σ of the network-mean ZWD with the satellite clocks estimated (median over epochs) [m]; null when they were known */
                mean_zwd_sigma_clocks_estimated_m: number | null;
                /** @description The same with the satellite clocks known (independent stations) [m] */
                mean_zwd_sigma_clocks_known_m: number | null;
                /** @description Correlation of the network-mean ZWD with the mean clock term of the epoch (median); near ±1 when the clocks absorb the common mode */
                correlation_with_clocks: number | null;
                /** @description Largest distance between two stations (chord) [km] */
                extent_km: number;
                /** @description Largest angle between two stations seen from a GNSS satellite 20 200 km above the centroid [deg] */
                extent_nadir_deg: number;
              };
              statistics: {
                stations: number;
                epochs: number;
                observations_total: number;
                observations_used: number;
                observations_rejected: number;
                /** @description Dropped: their satellite was seen by one station only at that epoch */
                observations_single_station_satellite: number;
                /** @description (epoch, satellite) pairs dropped for that reason */
                single_station_satellites: number;
                /** @description Epochs with observations of one station only (no information with satellite clocks estimated) */
                single_station_epochs: number;
                unknowns: number;
                clock_unknowns: number;
                constraints: number;
                degrees_of_freedom: number;
                rms_m: number | null;
                variance_factor: number | null;
                /** @description Factor on the formal errors (√variance factor with scale_sigmas); null when it differs per station */
                sigma_scale: number | null;
                solutions: number;
                screening_complete: boolean;
              };
              /** @description The models and settings that produced this result */
              models: {
                [key: string]: string | number | boolean | null;
              };
              /** @description Short hash of `models`: results are homogeneous only when it is equal */
              model_fingerprint: string;
              /** @description Values defaulted or extrapolated, elevations below 3°, and similar */
              warnings: string[];
              /** @description Per station: its series as stored in the station's delay series under this source and the result's model_fingerprint */
              stored: {
                station: string;
                source: string;
                /**
                 * @description Where the station's met came from: its records in the request's met[], its stored met series, or neither (ZHD a-priori, no PWV)
                 * @enum {string}
                 */
                met_used: 'request' | 'archive' | 'none';
                inserted: number;
                updated: number;
                unchanged: number;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        413: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        422: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/stations/{station_id}': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * One station
     * @description Role needed: read. Reads need a key of role read or above when TROPO_READ_KEYS_REQUIRED=true.
     */
    get: {
      parameters: {
        query?: never;
        header?: never;
        path: {
          /** @description Station identifier: 1-32 characters of letters, digits, "-" and "_" */
          station_id: string;
        };
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              station_id: string;
              name: string;
              /** @description Geodetic latitude (WGS84) [deg] */
              latitude_deg: number;
              /** @description Longitude, east positive [deg] */
              longitude_deg: number;
              /** @description Antenna height above the WGS84 ellipsoid [m] */
              height_m: number;
              /** @description Geoid undulation N of EGM96 at the station (height of mean sea level above the ellipsoid) [m], to 1 cm */
              geoid_undulation_m: number;
              /** @description Antenna altitude above mean sea level (the EGM96 geoid): height_m − geoid_undulation_m [m], to 1 cm */
              altitude_m: number;
              /** @description [m]; null = at the antenna height */
              met_height_m: number | null;
              description: string | null;
              created_at: string;
              updated_at: string;
              /** @description Where the station series are read */
              links: {
                met: string;
                delays: string;
                precipitable_water: string;
              };
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    /**
     * Create or replace a station
     * @description Creates the station (201) or replaces its description (200); its series stay. The id of a deleted station is reserved until it is purged or restored (409). Body limit: 1048576 bytes. Role needed: write. Needs `Authorization: Bearer <key>` of role write or admin (401 without a key, 403 with a key of role read or one not accepted).
     */
    put: {
      parameters: {
        query?: never;
        header?: never;
        path: {
          /** @description Station identifier: 1-32 characters of letters, digits, "-" and "_" */
          station_id: string;
        };
        cookie?: never;
      };
      requestBody: {
        content: {
          'application/json': {
            /** @description Display name */
            name: string;
            /** @description Geodetic latitude (WGS84) [deg], [-90, 90] deg */
            latitude_deg: number;
            /** @description Longitude, east positive [deg], [-180, 360] deg */
            longitude_deg: number;
            /** @description Antenna height above the WGS84 ellipsoid [m], [-500, 9000] m */
            height_m: number;
            met_height_m?: number | null;
            /** @description Free text, at most 2000 characters */
            description?: string | null;
          };
        };
      };
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              station_id: string;
              name: string;
              /** @description Geodetic latitude (WGS84) [deg] */
              latitude_deg: number;
              /** @description Longitude, east positive [deg] */
              longitude_deg: number;
              /** @description Antenna height above the WGS84 ellipsoid [m] */
              height_m: number;
              /** @description Geoid undulation N of EGM96 at the station (height of mean sea level above the ellipsoid) [m], to 1 cm */
              geoid_undulation_m: number;
              /** @description Antenna altitude above mean sea level (the EGM96 geoid): height_m − geoid_undulation_m [m], to 1 cm */
              altitude_m: number;
              /** @description [m]; null = at the antenna height */
              met_height_m: number | null;
              description: string | null;
              created_at: string;
              updated_at: string;
              /** @description Where the station series are read */
              links: {
                met: string;
                delays: string;
                precipitable_water: string;
              };
            };
          };
        };
        /** @description Default Response */
        201: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              station_id: string;
              name: string;
              /** @description Geodetic latitude (WGS84) [deg] */
              latitude_deg: number;
              /** @description Longitude, east positive [deg] */
              longitude_deg: number;
              /** @description Antenna height above the WGS84 ellipsoid [m] */
              height_m: number;
              /** @description Geoid undulation N of EGM96 at the station (height of mean sea level above the ellipsoid) [m], to 1 cm */
              geoid_undulation_m: number;
              /** @description Antenna altitude above mean sea level (the EGM96 geoid): height_m − geoid_undulation_m [m], to 1 cm */
              altitude_m: number;
              /** @description [m]; null = at the antenna height */
              met_height_m: number | null;
              description: string | null;
              created_at: string;
              updated_at: string;
              /** @description Where the station series are read */
              links: {
                met: string;
                delays: string;
                precipitable_water: string;
              };
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        409: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        413: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        415: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    post?: never;
    /**
     * Delete a station (restorable until purged)
     * @description Marks the station deleted: it and its met and delay series are hidden from every read and refuse writes, and its id stays reserved. It can be restored (POST /v1/stations/{station_id}/restore) until the purge removes it with its series, TROPODELAY_DELETE_RETENTION_DAYS after the delete. `?purge=true` removes it for good at once (also a station already marked deleted). Role needed: admin. Needs `Authorization: Bearer <key>` of role admin (401 without a key, 403 with a key of role read or write or one not accepted).
     */
    delete: {
      parameters: {
        query?: {
          /** @description true: remove the station and its series for good now, instead of marking it deleted */
          purge?: 'true' | 'false';
        };
        header?: never;
        path: {
          /** @description Station identifier: 1-32 characters of letters, digits, "-" and "_" */
          station_id: string;
        };
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Deleted */
        204: {
          headers: {
            [name: string]: unknown;
          };
          content?: never;
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/stations': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * List the stations
     * @description Role needed: read. Reads need a key of role read or above when TROPO_READ_KEYS_REQUIRED=true.
     */
    get: {
      parameters: {
        query?: never;
        header?: never;
        path?: never;
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              stations: {
                station_id: string;
                name: string;
                /** @description Geodetic latitude (WGS84) [deg] */
                latitude_deg: number;
                /** @description Longitude, east positive [deg] */
                longitude_deg: number;
                /** @description Antenna height above the WGS84 ellipsoid [m] */
                height_m: number;
                /** @description Geoid undulation N of EGM96 at the station (height of mean sea level above the ellipsoid) [m], to 1 cm */
                geoid_undulation_m: number;
                /** @description Antenna altitude above mean sea level (the EGM96 geoid): height_m − geoid_undulation_m [m], to 1 cm */
                altitude_m: number;
                /** @description [m]; null = at the antenna height */
                met_height_m: number | null;
                description: string | null;
                created_at: string;
                updated_at: string;
                /** @description Where the station series are read */
                links: {
                  met: string;
                  delays: string;
                  precipitable_water: string;
                };
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/stations/{station_id}/met': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * Met records of a station in a time range, as stored
     * @description from/to inclusive, ISO 8601; one request reads at most 366 days (TROPO_MAX_READ_RANGE_DAYS). format=csv answers text/csv with a header row of the field names. Role needed: read. Reads need a key of role read or above when TROPO_READ_KEYS_REQUIRED=true.
     */
    get: {
      parameters: {
        query?: {
          /** @description Start of the range, inclusive (ISO 8601 date-time, or a date for 00:00Z of that day). Default: `to` minus the maximum range */
          from?: string;
          /** @description End of the range, inclusive (ISO 8601 date-time, or a date for the whole of that UTC day). Default: `from` plus the maximum range, or the latest stored epoch when neither is given */
          to?: string;
          /** @description json (default) or csv (one header row with the JSON field names) */
          format?: 'json' | 'csv';
          /** @description Only the rows of this source */
          source?: string;
        };
        header?: never;
        path: {
          /** @description Station identifier: 1-32 characters of letters, digits, "-" and "_" */
          station_id: string;
        };
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              station_id: string;
              /** @description Start of the range read (inclusive) */
              from: string;
              /** @description End of the range read (inclusive) */
              to: string;
              records: {
                epoch: string;
                source: string;
                /** @description [hPa] at the met sensor */
                pressure_hpa: number | null;
                /** @description [°C] at the met sensor */
                temperature_c: number | null;
                /** @description [%] */
                relative_humidity_pct: number | null;
                /** @description [°C] */
                dewpoint_c: number | null;
                /** @description [hPa] */
                vapour_pressure_hpa: number | null;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    put?: never;
    /**
     * Store met records of a station (JSON, CSV or a RINEX meteorological file)
     * @description The body is one of:
     *     - application/json: `{ records: [...], source? }` as below;
     *     - text/csv: a header row with the field names of a record (epoch, source, pressure_hpa, temperature_c, relative_humidity_pct, dewpoint_c, vapour_pressure_hpa), then one record per row; `?source=` names the producer of rows without a `source` cell. The CSV that GET answers with format=csv uploads back unchanged;
     *     - text/plain: a RINEX meteorological observation file, version 2.10/2.11 or 3.00-3.05, recognised by its header. PR, TD and HR are stored; other observation types (ZW, ZD, ZT, WD, WS, RI, HI, ...) are counted in `rinex.ignored_values` and not stored; epochs (GPS time) are converted to UTC.
     *     Records are keyed by (epoch, source): sending the same records again changes nothing. Each record needs pressure_hpa or temperature_c and at most one humidity field. Bad records are listed in `rejected` (by index or line) and the good ones stored; a body that is not what its content type claims, or has no good record, is a 400 and stores nothing.
     *     Body limit: 33554432 bytes (32 MiB). Writes need `Authorization: Bearer <key>`. Role needed: write. Needs `Authorization: Bearer <key>` of role write or admin (401 without a key, 403 with a key of role read or one not accepted).
     */
    post: {
      parameters: {
        query?: {
          /** @description Producer of the records of a CSV or RINEX body (default "default"); a JSON body names it in `source`; a CSV row with a `source` cell is stored under that source */
          source?: string;
        };
        header?: never;
        path: {
          /** @description Station identifier: 1-32 characters of letters, digits, "-" and "_" */
          station_id: string;
        };
        cookie?: never;
      };
      requestBody: {
        content: {
          'application/json': {
            /** @description 1..100000 met records; each is checked on its own: bad ones are reported in `rejected`, the good ones stored */
            records: {
              /**
               * Format: date-time
               * @description Epoch, ISO 8601 date-time (UTC, e.g. 2026-03-14T12:00:00Z; an offset is converted to UTC)
               */
              epoch: string;
              pressure_hpa?: number | null;
              temperature_c?: number | null;
              relative_humidity_pct?: number | null;
              dewpoint_c?: number | null;
              vapour_pressure_hpa?: number | null;
            }[];
            /** @description Producer of the records (default "default") */
            source?: string;
          };
        };
      };
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              station_id: string;
              source: string;
              /** @description Records whose (epoch, source) was new */
              inserted: number;
              /** @description Records that replaced different stored values */
              updated: number;
              /** @description Records equal to what was stored (a re-send) */
              unchanged: number;
              /** @description Bad records, one by one (the first 1000); none of them is stored */
              rejected: {
                /** @description Index of the record in `records` (JSON) */
                index?: number;
                /** @description 1-based line of the record (CSV, RINEX) */
                line?: number;
                reason: string;
              }[];
              /** @description Number of bad records */
              rejected_count: number;
              warnings: string[];
              /**
               * @description How the body was read
               * @enum {string}
               */
              format: 'json' | 'csv' | 'rinex-met';
              /** @description Sources the stored records went to: `source` alone, or those a CSV named in its `source` column */
              sources: string[];
              /** @description What the RINEX meteorological file held */
              rinex?: {
                version: string;
                marker_name: string | null;
                observation_types: string[];
                /** @description Values of types other than PR, TD, HR, counted per type (not stored) */
                ignored_values: {
                  [key: string]: number;
                };
              };
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        413: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        415: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/stations/{station_id}/delays': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * Stored delay series of a station in a time range
     * @description Every record carries its source and model fingerprint; `homogeneous` is false (with a warning listing the fingerprints and their epochs) when the range mixes model sets. from/to inclusive, ISO 8601; one request reads at most 366 days. format=csv answers text/csv with a header row of the field names and the headers x-homogeneous and x-model-fingerprints. Role needed: read. Reads need a key of role read or above when TROPO_READ_KEYS_REQUIRED=true.
     */
    get: {
      parameters: {
        query?: {
          /** @description Start of the range, inclusive (ISO 8601 date-time, or a date for 00:00Z of that day). Default: `to` minus the maximum range */
          from?: string;
          /** @description End of the range, inclusive (ISO 8601 date-time, or a date for the whole of that UTC day). Default: `from` plus the maximum range, or the latest stored epoch when neither is given */
          to?: string;
          /** @description json (default) or csv (one header row with the JSON field names) */
          format?: 'json' | 'csv';
          /** @description Only the rows of this source */
          source?: string;
        };
        header?: never;
        path: {
          /** @description Station identifier: 1-32 characters of letters, digits, "-" and "_" */
          station_id: string;
        };
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              station_id: string;
              /** @description Start of the range read (inclusive) */
              from: string;
              /** @description End of the range read (inclusive) */
              to: string;
              records: {
                epoch: string;
                /** @description [m] */
                ztd_m: number;
                /** @description [m]; null when the producer gave none */
                ztd_sigma_m: number | null;
                /** @description [m] */
                zwd_m: number | null;
                /** @description [m] */
                zwd_sigma_m: number | null;
                /** @description [m] */
                north_gradient_m: number | null;
                /** @description [m] */
                east_gradient_m: number | null;
                /** @description [m] */
                north_gradient_sigma_m: number | null;
                /** @description [m] */
                east_gradient_sigma_m: number | null;
                source: string;
                model_fingerprint: string;
              }[];
              /** @description True when every record of the range was produced by the same model set (one fingerprint) */
              homogeneous: boolean;
              /** @description The model sets met in the range, with the epochs they cover */
              model_sets: {
                model_fingerprint: string;
                /** @description The models and settings that produced this result */
                models: {
                  [key: string]: string | number | boolean | null;
                };
                sources: string[];
                first_epoch: string;
                last_epoch: string;
                count: number;
              }[];
              warnings: string[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    put?: never;
    /**
     * Deposit a zenith total delay series computed elsewhere
     * @description Stores the records keyed by (epoch, source) with the fingerprint of `models` plus `deposited_by: source`: a retrieval shows it and says when a range mixes fingerprints. Bad records are listed in `rejected`, the good ones stored; none good is a 400. Body limit: 33554432 bytes (32 MiB). Writes need `Authorization: Bearer <key>`. Role needed: write. Needs `Authorization: Bearer <key>` of role write or admin (401 without a key, 403 with a key of role read or one not accepted).
     */
    post: {
      parameters: {
        query?: never;
        header?: never;
        path: {
          /** @description Station identifier: 1-32 characters of letters, digits, "-" and "_" */
          station_id: string;
        };
        cookie?: never;
      };
      requestBody: {
        content: {
          'application/json': {
            /** @description 1..100000 delay records; each is checked on its own: bad ones are reported in `rejected`, the good ones stored */
            records: {
              /**
               * Format: date-time
               * @description Epoch, ISO 8601 date-time (UTC, e.g. 2026-03-14T12:00:00Z; an offset is converted to UTC)
               */
              epoch: string;
              /** @description Zenith total delay [m], [1, 3] m */
              ztd_m: number;
              ztd_sigma_m?: number | null;
              zwd_m?: number | null;
              zwd_sigma_m?: number | null;
              north_gradient_m?: number | null;
              east_gradient_m?: number | null;
              north_gradient_sigma_m?: number | null;
              east_gradient_sigma_m?: number | null;
            }[];
            /** @description Producer of the series (required): part of the key and of the fingerprint */
            source: string;
            /** @description The models and settings that produced the series (e.g. mapping function, cutoff, random-walk settings); with `source` they make the fingerprint */
            models?: {
              [key: string]: string | number | boolean | null;
            };
          };
        };
      };
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              station_id: string;
              source: string;
              /** @description Records whose (epoch, source) was new */
              inserted: number;
              /** @description Records that replaced different stored values */
              updated: number;
              /** @description Records equal to what was stored (a re-send) */
              unchanged: number;
              /** @description Bad records, one by one (the first 1000); none of them is stored */
              rejected: {
                /** @description Index of the record in `records` (JSON) */
                index?: number;
                /** @description 1-based line of the record (CSV, RINEX) */
                line?: number;
                reason: string;
              }[];
              /** @description Number of bad records */
              rejected_count: number;
              warnings: string[];
              /** @description The models and settings that produced this result */
              models: {
                [key: string]: string | number | boolean | null;
              };
              /** @description Fingerprint stored with every record of this deposit */
              model_fingerprint: string;
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        413: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        415: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/stations/{station_id}/precipitable-water': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * Precipitable water for the stored delays of a station
     * @description For each stored delay epoch in the range: pressure and temperature interpolated linearly in time from the stored met series (not across gaps longer than met_max_gap_s, default 3 h; never extrapolated), reduced from met_height_m to the antenna height; ZHD (Saastamoinen/Davis 1985), ZWD = ZTD − ZHD, Tm (Bevis et al. 1992), PWV = Π(Tm)·ZWD (Bevis et al. 1994) and its sigma.
     *     Quality flag per record, most severe first: met-missing (no PWV: no pressure or temperature within the gap limit), delay-sigma-large (ztd_sigma_m > max_ztd_sigma_m, default 0.01 m), delay-sigma-unknown (no ztd_sigma_m; pwv_sigma_mm null), met-interpolated, ok.
     *     `homogeneous` is false when the delays of the range come from more than one model set. One request reads at most 366 days. format=csv answers text/csv with a header row of the record field names and the headers x-homogeneous and x-model-fingerprints. Role needed: read. Reads need a key of role read or above when TROPO_READ_KEYS_REQUIRED=true.
     */
    get: {
      parameters: {
        query?: {
          /** @description Start of the range, inclusive (ISO 8601 date-time, or a date for 00:00Z of that day). Default: `to` minus the maximum range */
          from?: string;
          /** @description End of the range, inclusive (ISO 8601 date-time, or a date for the whole of that UTC day). Default: `from` plus the maximum range, or the latest stored epoch when neither is given */
          to?: string;
          /** @description json (default) or csv (one header row with the JSON field names) */
          format?: 'json' | 'csv';
          /** @description Only the delay rows of this source */
          source?: string;
          /** @description Only the met rows of this source (default: all; at one epoch the first source in name order) */
          met_source?: string;
          /** @description Longest gap between two met records interpolated across [s], [0, 86400]; default 10800 (3 h). The same name as the estimation option */
          met_max_gap_s?: number;
          /** @description Deprecated alias of met_max_gap_s (still works; the answer then carries a warning) */
          max_met_gap_s?: number;
          /** @description ztd_sigma_m above this flags the record "delay-sigma-large" [m]; default 0.01 */
          max_ztd_sigma_m?: number;
        };
        header?: never;
        path: {
          /** @description Station identifier: 1-32 characters of letters, digits, "-" and "_" */
          station_id: string;
        };
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              station_id: string;
              /** @description Start of the range read (inclusive) */
              from: string;
              /** @description End of the range read (inclusive) */
              to: string;
              records: {
                epoch: string;
                /** @description Source of the delay row */
                source: string;
                /** @description Fingerprint of the delay row */
                model_fingerprint: string;
                /** @description Stored zenith total delay [m] */
                ztd_m: number;
                /** @description [m] */
                ztd_sigma_m: number | null;
                /** @description Pressure at the antenna height used for ZHD [hPa] (interpolated, reduced from met_height_m) */
                pressure_hpa: number | null;
                /** @description Temperature at the antenna height used for Tm [°C] */
                temperature_c: number | null;
                /** @description Zenith hydrostatic delay from pressure_hpa [m]; null without pressure */
                zhd_m: number | null;
                /** @description ZTD − ZHD [m] */
                zwd_m: number | null;
                /** @description [m]; null when ztd_sigma_m is unknown */
                zwd_sigma_m: number | null;
                /** @description Weighted mean temperature, Bevis et al. (1992) [K] */
                tm_k: number | null;
                /** @description [K] */
                tm_sigma_k: number | null;
                /** @description Π = PWV/ZWD, Bevis et al. (1994) [-] */
                conversion_factor: number | null;
                /** @description Precipitable water vapour [mm]; null when met is missing */
                pwv_mm: number | null;
                /** @description [mm]; null when PWV or ztd_sigma_m is missing */
                pwv_sigma_mm: number | null;
                /**
                 * @description One of met-missing, delay-sigma-large, delay-sigma-unknown, met-interpolated, ok (most severe first; see the README)
                 * @enum {string}
                 */
                quality: 'met-missing' | 'delay-sigma-large' | 'delay-sigma-unknown' | 'met-interpolated' | 'ok';
                /** @enum {string} */
                pressure_quality: 'measured' | 'interpolated' | 'missing';
                /** @enum {string} */
                temperature_quality: 'measured' | 'interpolated' | 'missing';
              }[];
              /** @description True when every record of the range was produced by the same model set (one fingerprint) */
              homogeneous: boolean;
              /** @description The model sets met in the range, with the epochs they cover */
              model_sets: {
                model_fingerprint: string;
                /** @description The models and settings that produced this result */
                models: {
                  [key: string]: string | number | boolean | null;
                };
                sources: string[];
                first_epoch: string;
                last_epoch: string;
                count: number;
              }[];
              warnings: string[];
              /** @description Models and settings of the PWV retrieval itself (ZHD, Tm, Π, met interpolation) */
              retrieval: {
                /** @description The models and settings that produced this result */
                models: {
                  [key: string]: string | number | boolean | null;
                };
                /** @description Short hash of `models`: results are homogeneous only when it is equal */
                model_fingerprint: string;
                /** @description The met gap limit used [s] */
                met_max_gap_s: number;
                /** @description Deprecated: the same as met_max_gap_s */
                max_met_gap_s: number;
                max_ztd_sigma_m: number;
              };
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/stations/{station_id}/zwd-estimates': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /**
     * Estimate ZWD and gradients for a station and store the result as its delay series
     * @description The request of POST /v1/zwd-estimates without `site`: the station gives latitude, longitude and height (JSON body, or text/csv with the options as query parameters). Without `met` in the request, the station's stored met series (records with pressure and temperature, reduced from met_height_m to the antenna height; at one epoch the first source in name order) from 1 day before the first to 1 day after the last observation serves as `met`. That read is bounded like the read routes: a span longer than the maximum read range (TROPO_MAX_READ_RANGE_DAYS) or more than 100000 stored met records is a 400 naming `observations`. The result is returned as by /v1/zwd-estimates and stored as the station's delay series under `?source=` (default "zwd-estimates") and the result's model_fingerprint: per epoch ztd_m, ztd_sigma_m = sigma_m (the a-priori ZHD is a fixed value), zwd_m, zwd_sigma_m, gradients and their sigmas. Up to 900000 observations. Body limit: 100663296 bytes. Writes need `Authorization: Bearer <key>`. Role needed: write. Needs `Authorization: Bearer <key>` of role write or admin (401 without a key, 403 with a key of role read or one not accepted).
     */
    post: {
      parameters: {
        query?: {
          /** @description ZHD the residuals were formed with; default: Saastamoinen ZHD of the standard atmosphere at the site [m], [1, 3] m */
          apriori_zhd_m?: number;
          /** @description ZWD the residuals were formed with; default 0 [m], [0, 1] m */
          apriori_zwd_m?: number;
          /** @description Spacing Δ of the ZWD nodes of the output, on round UTC epochs jΔ (multiples of Δ since 1970-01-01T00:00Z); with parametrisation "nodes" also the spacing of the piecewise-linear model [s], (0, 2592000] s */
          zwd_interval_s?: number;
          /** @description Random-walk density q of the ZWD: consecutive states x_{j+1} − x_j = 0 ± q √(Δt/1 h) (states at every epoch, or nodes) [m/√h], (0, 10] m/√h; null = no constraint */
          zwd_random_walk_m_per_sqrt_h?: number | null;
          /** @description A-priori constraint on the first ZWD node, x_0 = 0 ± σ [m], (0, 10] m; null = none */
          zwd_apriori_sigma_m?: number | null;
          /** @description Spacing of the gradient nodes of the output (round UTC epochs; with parametrisation "nodes" the model's nodes) [s], (0, 2592000] s */
          gradient_interval_s?: number;
          /** @description Random-walk density q of each gradient component: consecutive states x_{j+1} − x_j = 0 ± q √(Δt/1 h) [m/√h], (0, 10] m/√h; null = no constraint */
          gradient_random_walk_m_per_sqrt_h?: number | null;
          /** @description A-priori constraint on the first gradient node, x_0 = 0 ± σ [m], (0, 1] m; null = none */
          gradient_apriori_sigma_m?: number | null;
          /** @description Estimate one free bias per epoch (receiver clock and other common terms); pre-eliminated */
          epoch_bias?: boolean;
          /** @description σ_i of observations without sigma_m, σ² = a² + b²/sin²e: "elevation" b = sigma0_m, a = 0; "uniform" a = sigma0_m, b = 0; "elevation-components" b = sigma0_m and a = sigma_constant_m (both re-estimated with scale_sigmas); one of elevation, uniform, elevation-components */
          weighting?: 'elevation' | 'uniform' | 'elevation-components';
          /** @description σ0 of the weighting scheme (zenith standard deviation of a residual) [m], (0, 1] m */
          sigma0_m?: number;
          /** @description Observations below this elevation are dropped (and counted) [deg], [0, 90) deg */
          elevation_cutoff_deg?: number;
          /** @description Reject while the largest |normalised residual| (Pope τ = v/(σ̂0 σ_v)) exceeds k [], [2, 1000]; null = no screening */
          outlier_threshold?: number | null;
          /** @description one-per-solution: reject the largest τ > k, re-solve, repeat. one-per-window: in each iteration also reject the largest τ > k of every stretch more than a window away from the others (nodes: max(3 ZWD intervals, 30 min); every-epoch: the smoother kernel length, 5–30 min; same result at a cost linear in the span); one of one-per-window, one-per-solution */
          outlier_rejection?: 'one-per-window' | 'one-per-solution';
          /** @description Screening stops after this many rejections, with a warning [], [0, 100000] */
          max_rejections?: number;
          /** @description Re-estimate the observation weights from the residuals (variance components: σ0, or a and b of "elevation-components") and solve again; the random-walk and a-priori constraints keep their sigmas. false = the weights as given */
          scale_sigmas?: boolean;
          /** @description a of weighting "elevation-components" (σ² = a² + b²/sin²e), the starting value when scale_sigmas re-estimates it; ignored by the other schemes [m], [0, 1] m; null = sigma0_m / 3 */
          sigma_constant_m?: number | null;
          /** @description every-epoch: a random-walk state of ZWD and gradients at every epoch, nodes interpolated with the Brownian-bridge variance (formal errors hold at any node spacing). nodes: piecewise linear between the nodes (the variation between nodes is not in σ); one of every-epoch, nodes */
          parametrisation?: 'every-epoch' | 'nodes';
          /** @description Estimate the residuals' time correlation per satellite arc and inflate the formal errors by it (docs/zwd-estimation.md, "Formal errors") */
          correlated_noise?: boolean;
          /** @description Wet mapping function of the estimator (src/domain/mapping registry). vmf1 needs per-epoch coefficients in the JSON body's vmf1_coefficients [{epoch, a_h, a_w}], interpolated linearly in time and spanning every observation epoch (a text/csv request cannot carry them); one of niell, vmf1, chao, cosecant */
          wet_mapping?: 'niell' | 'vmf1' | 'chao' | 'cosecant';
          /** @description Longest gap between met records that is interpolated across (the same setting as met_max_gap_s of the station PWV route) [s], (0, 86400] s */
          met_max_gap_s?: number;
          /** @description Estimate gradients (on) or not (off) */
          gradients?: 'on' | 'off';
          /** @description rows: an array of objects (default); columns: one array per field, rounded to the documented precision */
          shape?: 'rows' | 'columns';
          /** @description Comma-separated per-row fields to return (default: all); applies to rows, columns and Arrow answers */
          fields?: string;
          /** @description Source under which the estimated series is stored (default "zwd-estimates") */
          source?: string;
        };
        header?: never;
        path: {
          /** @description Station identifier: 1-32 characters of letters, digits, "-" and "_" */
          station_id: string;
        };
        cookie?: never;
      };
      requestBody: {
        content: {
          'application/json': {
            /** @description Residuals of one station, in any order; grouped by epoch. An array of objects, or an object of column arrays */
            observations:
              | {
                  /**
                   * Format: date-time
                   * @description Epoch, ISO 8601 date-time (UTC, e.g. 2026-03-14T12:00:00Z; an offset is converted to UTC)
                   */
                  epoch: string;
                  /** @description Satellite identifier; each (epoch, satellite) pair may appear once */
                  satellite: string;
                  /** @description Vacuum (geometric) elevation angle; below 3° the answer carries a warning; mapping functions refuse elevations below 1° (a profile is still traced there) [deg], (0, 90] deg */
                  elevation_deg: number;
                  /** @description Azimuth from north through east [deg], [0, 360] deg */
                  azimuth_deg: number;
                  /** @description Residual formed with the a-priori troposphere (observed − computed); may contain a receiver clock [m], [-1000000, 1000000] m */
                  residual_m: number;
                  /** @description Standard deviation of residual_m; absent = from options.weighting and sigma0_m [m], > 0, at most 10 */
                  sigma_m?: number;
                }[]
              | {
                  epoch: string[];
                  satellite: string[];
                  elevation_deg: number[];
                  azimuth_deg: number[];
                  residual_m: number[];
                  sigma_m: number[];
                };
            /** @description The a-priori zenith delays the residuals were formed with */
            apriori?: {
              /** @description ZHD the residuals were formed with; default: Saastamoinen ZHD of the standard atmosphere at the site [m], [1, 3] m */
              zhd_m?: number;
              /** @description ZWD the residuals were formed with; default 0 [m], [0, 1] m */
              zwd_m?: number;
            };
            /** @description Surface met at the site, interpolated linearly to the epochs (not across gaps longer than options.met_max_gap_s); enables ZHD, ZWD and PWV per epoch */
            met?: {
              /**
               * Format: date-time
               * @description Epoch, ISO 8601 date-time (UTC, e.g. 2026-03-14T12:00:00Z; an offset is converted to UTC)
               */
              epoch: string;
              /** @description Measured surface pressure at the site height [hPa], [300, 1100] hPa */
              pressure_hpa: number;
              /** @description Measured surface temperature at the site height [°C], [-90, 60] °C */
              temperature_c: number;
              /** @description Relative humidity [%], 0..100; accepted, not needed for PWV */
              relative_humidity_pct?: number;
            }[];
            /** @description VMF1 a coefficients per epoch (Boehm et al. 2006; from the VMF1 grids or site files), for options.wet_mapping "vmf1" and only then: a_w maps the wet delay, interpolated linearly in time between the given epochs, which must span every observation epoch (no extrapolation: 400 otherwise). a_h is taken for completeness (the estimator maps the wet delay only) */
            vmf1_coefficients?: {
              /**
               * Format: date-time
               * @description Epoch, ISO 8601 date-time (UTC, e.g. 2026-03-14T12:00:00Z; an offset is converted to UTC)
               */
              epoch: string;
              /** @description VMF1 hydrostatic a coefficient [], [0.0005, 0.002] */
              a_h: number;
              /** @description VMF1 wet a coefficient [], [0, 0.001] */
              a_w: number;
            }[];
            /**
             * @description Estimation options; every one has a default (docs/zwd-estimation.md lists them)
             * @default {}
             */
            options?: {
              /**
               * @description Spacing Δ of the ZWD nodes of the output, on round UTC epochs jΔ (multiples of Δ since 1970-01-01T00:00Z); with parametrisation "nodes" also the spacing of the piecewise-linear model [s], (0, 2592000] s
               * @default 300
               */
              zwd_interval_s?: number;
              /**
               * @description Random-walk density q of the ZWD: consecutive states x_{j+1} − x_j = 0 ± q √(Δt/1 h) (states at every epoch, or nodes) [m/√h], (0, 10] m/√h; null = no constraint
               * @default 0.01
               */
              zwd_random_walk_m_per_sqrt_h?: number | null;
              /**
               * @description A-priori constraint on the first ZWD node, x_0 = 0 ± σ [m], (0, 10] m; null = none
               * @default 0.5
               */
              zwd_apriori_sigma_m?: number | null;
              /**
               * @description Estimate one free bias per epoch (receiver clock and other common terms); pre-eliminated
               * @default true
               */
              epoch_bias?: boolean;
              /**
               * @description σ_i of observations without sigma_m, σ² = a² + b²/sin²e: "elevation" b = sigma0_m, a = 0; "uniform" a = sigma0_m, b = 0; "elevation-components" b = sigma0_m and a = sigma_constant_m (both re-estimated with scale_sigmas); one of elevation, uniform, elevation-components
               * @default elevation
               * @enum {string}
               */
              weighting?: 'elevation' | 'uniform' | 'elevation-components';
              /**
               * @description σ0 of the weighting scheme (zenith standard deviation of a residual) [m], (0, 1] m
               * @default 0.003
               */
              sigma0_m?: number;
              /**
               * @description Observations below this elevation are dropped (and counted) [deg], [0, 90) deg
               * @default 7
               */
              elevation_cutoff_deg?: number;
              /**
               * @description Reject while the largest |normalised residual| (Pope τ = v/(σ̂0 σ_v)) exceeds k [], [2, 1000]; null = no screening
               * @default 4
               */
              outlier_threshold?: number | null;
              /**
               * @description one-per-solution: reject the largest τ > k, re-solve, repeat. one-per-window: in each iteration also reject the largest τ > k of every stretch more than a window away from the others (nodes: max(3 ZWD intervals, 30 min); every-epoch: the smoother kernel length, 5–30 min; same result at a cost linear in the span); one of one-per-window, one-per-solution
               * @default one-per-window
               * @enum {string}
               */
              outlier_rejection?: 'one-per-window' | 'one-per-solution';
              /**
               * @description Screening stops after this many rejections, with a warning [], [0, 100000]
               * @default 1000
               */
              max_rejections?: number;
              /**
               * @description Re-estimate the observation weights from the residuals (variance components: σ0, or a and b of "elevation-components") and solve again; the random-walk and a-priori constraints keep their sigmas. false = the weights as given
               * @default true
               */
              scale_sigmas?: boolean;
              /**
               * @description a of weighting "elevation-components" (σ² = a² + b²/sin²e), the starting value when scale_sigmas re-estimates it; ignored by the other schemes [m], [0, 1] m; null = sigma0_m / 3
               * @default null
               */
              sigma_constant_m?: number | null;
              /**
               * @description every-epoch: a random-walk state of ZWD and gradients at every epoch, nodes interpolated with the Brownian-bridge variance (formal errors hold at any node spacing). nodes: piecewise linear between the nodes (the variation between nodes is not in σ); one of every-epoch, nodes
               * @default every-epoch
               * @enum {string}
               */
              parametrisation?: 'every-epoch' | 'nodes';
              /**
               * @description Estimate the residuals' time correlation per satellite arc and inflate the formal errors by it (docs/zwd-estimation.md, "Formal errors")
               * @default true
               */
              correlated_noise?: boolean;
              /**
               * @description Wet mapping function of the estimator (src/domain/mapping registry). vmf1 needs per-epoch coefficients in the JSON body's vmf1_coefficients [{epoch, a_h, a_w}], interpolated linearly in time and spanning every observation epoch (a text/csv request cannot carry them); one of niell, vmf1, chao, cosecant
               * @default niell
               * @enum {string}
               */
              wet_mapping?: 'niell' | 'vmf1' | 'chao' | 'cosecant';
              /**
               * @description Longest gap between met records that is interpolated across (the same setting as met_max_gap_s of the station PWV route) [s], (0, 86400] s
               * @default 10800
               */
              met_max_gap_s?: number;
              /** @default {} */
              gradients?: {
                /**
                 * @description Spacing of the gradient nodes of the output (round UTC epochs; with parametrisation "nodes" the model's nodes) [s], (0, 2592000] s
                 * @default 21600
                 */
                interval_s?: number;
                /**
                 * @description Random-walk density q of each gradient component: consecutive states x_{j+1} − x_j = 0 ± q √(Δt/1 h) [m/√h], (0, 10] m/√h; null = no constraint
                 * @default 0.001
                 */
                random_walk_m_per_sqrt_h?: number | null;
                /**
                 * @description A-priori constraint on the first gradient node, x_0 = 0 ± σ [m], (0, 1] m; null = none
                 * @default 0.01
                 */
                apriori_sigma_m?: number | null;
              } | null;
            };
          };
        };
      };
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              /** @description ZWD nodes. shape=rows: one object per row (with `fields`: the selected fields); shape=columns: one array per field, rounded to the documented precision (delays 1e-6 m, PWV 1e-4 mm, Tm 1e-4 K), null where a row has no value */
              zwd_nodes:
                | {
                    /** @description Node epoch jΔ on round UTC epochs */
                    epoch: string;
                    /** @description Estimated correction δw to the a-priori ZWD [m] */
                    correction_m: number;
                    /** @description A-priori ZWD + correction [m] (the nodes carry no met: series[].zwd_m is ztd_m − the ZHD of its zhd_source) */
                    zwd_m: number;
                    /** @description Formal standard deviation [m] (with the Brownian-bridge variance between epochs and the correlated-noise factor) */
                    sigma_m: number;
                    /** @description Used observations within one interval of the node; 0 = the value comes from the random walk alone (a node without data) */
                    observations_nearby: number;
                  }[]
                | {
                    /** @description Node epoch jΔ on round UTC epochs */
                    epoch?: string;
                    /** @description Estimated correction δw to the a-priori ZWD [m] */
                    correction_m?: number;
                    /** @description A-priori ZWD + correction [m] (the nodes carry no met: series[].zwd_m is ztd_m − the ZHD of its zhd_source) */
                    zwd_m?: number;
                    /** @description Formal standard deviation [m] (with the Brownian-bridge variance between epochs and the correlated-noise factor) */
                    sigma_m?: number;
                    /** @description Used observations within one interval of the node; 0 = the value comes from the random walk alone (a node without data) */
                    observations_nearby?: number;
                  }[]
                | {
                    [key: string]: (number | string | null)[];
                  };
              /** @description Gradient nodes; empty when gradients are off. shape=rows: one object per row (with `fields`: the selected fields); shape=columns: one array per field, rounded to the documented precision (delays 1e-6 m, PWV 1e-4 mm, Tm 1e-4 K), null where a row has no value */
              gradient_nodes:
                | {
                    epoch: string;
                    /** @description North gradient G_N [m] */
                    north_m: number;
                    /** @description East gradient G_E [m] */
                    east_m: number;
                    north_sigma_m: number;
                    east_sigma_m: number;
                    /** @description Used observations within one interval of the node; 0 = a node without data */
                    observations_nearby: number;
                  }[]
                | {
                    epoch?: string;
                    /** @description North gradient G_N [m] */
                    north_m?: number;
                    /** @description East gradient G_E [m] */
                    east_m?: number;
                    north_sigma_m?: number;
                    east_sigma_m?: number;
                    /** @description Used observations within one interval of the node; 0 = a node without data */
                    observations_nearby?: number;
                  }[]
                | {
                    [key: string]: (number | string | null)[];
                  };
              /** @description One entry per epoch with observations above the cutoff (the Arrow table of an Arrow answer). shape=rows: one object per row (with `fields`: the selected fields); shape=columns: one array per field, rounded to the documented precision (delays 1e-6 m, PWV 1e-4 mm, Tm 1e-4 K), null where a row has no value */
              series:
                | {
                    epoch: string;
                    /** @description δw interpolated between the adjacent nodes [m] */
                    correction_m: number;
                    /** @description ZWD = ztd_m − ZHD, one meaning at every epoch [m]: with met in the request, ZHD is the Saastamoinen ZHD of the surface pressure (interpolated within met_max_gap_s; across longer gaps bridged linearly, held from the nearest record beyond the records: zhd_source "met-bridged"); without met, the a-priori ZHD (zhd_source "apriori"). Continuous wherever ztd_m is */
                    zwd_m: number;
                    /**
                     * @description Where the ZHD behind zwd_m comes from: met (measured or interpolated pressure), met-bridged (an epoch without met), apriori (a request without met)
                     * @enum {string}
                     */
                    zhd_source: 'met' | 'met-bridged' | 'apriori';
                    /** @description Formal standard deviation of δw (with the covariance of the adjacent nodes) [m] */
                    sigma_m: number;
                    /** @description G_N at the epoch [m]; null when gradients are off */
                    north_gradient_m: number | null;
                    /** @description G_E at the epoch [m]; null when gradients are off */
                    east_gradient_m: number | null;
                    north_gradient_sigma_m: number | null;
                    east_gradient_sigma_m: number | null;
                    /** @description Estimated epoch bias [m]; null when epoch_bias is off or all observations of the epoch were rejected */
                    epoch_bias_m: number | null;
                    /** @description Observations of the epoch used in the final solution */
                    observations: number;
                    /** @description A-priori ZHD + a-priori ZWD + δw [m] */
                    ztd_m: number;
                    /**
                     * @description Met at this epoch: measured, interpolated or missing (only with met); "missing" epochs have no PWV and a bridged ZHD
                     * @enum {string}
                     */
                    met?: 'measured' | 'interpolated' | 'missing';
                    /** @description Saastamoinen ZHD of the surface pressure [m] (with met; at "missing" epochs the bridged pressure): zwd_m = ztd_m − zhd_m */
                    zhd_m?: number;
                    /** @description Weighted mean temperature, Bevis et al. (1992) [K] (with met) */
                    tm_k?: number;
                    /** @description Precipitable water vapour [mm] (with met) */
                    pwv_mm?: number;
                    /** @description Standard deviation of pwv_mm from the formal error of δw [mm] */
                    pwv_sigma_mm?: number;
                    /** @description Standard deviation of pwv_mm including the Tm regression uncertainty (4.74 K) [mm] */
                    pwv_total_sigma_mm?: number;
                  }[]
                | {
                    epoch?: string;
                    /** @description δw interpolated between the adjacent nodes [m] */
                    correction_m?: number;
                    /** @description ZWD = ztd_m − ZHD, one meaning at every epoch [m]: with met in the request, ZHD is the Saastamoinen ZHD of the surface pressure (interpolated within met_max_gap_s; across longer gaps bridged linearly, held from the nearest record beyond the records: zhd_source "met-bridged"); without met, the a-priori ZHD (zhd_source "apriori"). Continuous wherever ztd_m is */
                    zwd_m?: number;
                    /**
                     * @description Where the ZHD behind zwd_m comes from: met (measured or interpolated pressure), met-bridged (an epoch without met), apriori (a request without met)
                     * @enum {string}
                     */
                    zhd_source?: 'met' | 'met-bridged' | 'apriori';
                    /** @description Formal standard deviation of δw (with the covariance of the adjacent nodes) [m] */
                    sigma_m?: number;
                    /** @description G_N at the epoch [m]; null when gradients are off */
                    north_gradient_m?: number | null;
                    /** @description G_E at the epoch [m]; null when gradients are off */
                    east_gradient_m?: number | null;
                    north_gradient_sigma_m?: number | null;
                    east_gradient_sigma_m?: number | null;
                    /** @description Estimated epoch bias [m]; null when epoch_bias is off or all observations of the epoch were rejected */
                    epoch_bias_m?: number | null;
                    /** @description Observations of the epoch used in the final solution */
                    observations?: number;
                    /** @description A-priori ZHD + a-priori ZWD + δw [m] */
                    ztd_m?: number;
                    /**
                     * @description Met at this epoch: measured, interpolated or missing (only with met); "missing" epochs have no PWV and a bridged ZHD
                     * @enum {string}
                     */
                    met?: 'measured' | 'interpolated' | 'missing';
                    /** @description Saastamoinen ZHD of the surface pressure [m] (with met; at "missing" epochs the bridged pressure): zwd_m = ztd_m − zhd_m */
                    zhd_m?: number;
                    /** @description Weighted mean temperature, Bevis et al. (1992) [K] (with met) */
                    tm_k?: number;
                    /** @description Precipitable water vapour [mm] (with met) */
                    pwv_mm?: number;
                    /** @description Standard deviation of pwv_mm from the formal error of δw [mm] */
                    pwv_sigma_mm?: number;
                    /** @description Standard deviation of pwv_mm including the Tm regression uncertainty (4.74 K) [mm] */
                    pwv_total_sigma_mm?: number;
                  }[]
                | {
                    [key: string]: (number | string | null)[];
                  };
              /** @description Observations rejected by the screening. shape=rows: one object per row (with `fields`: the selected fields); shape=columns: one array per field, rounded to the documented precision (delays 1e-6 m, PWV 1e-4 mm, Tm 1e-4 K), null where a row has no value */
              rejected:
                | {
                    /** @description Index of the observation in the request (data row for CSV, 0-based) */
                    index: number;
                    epoch: string;
                    satellite: string;
                    /** @description The residual as sent [m] */
                    residual_m: number;
                    /** @description Post-fit residual when it was rejected [m] */
                    fitted_residual_m: number;
                    /** @description Pope τ = v/(σ̂0 σ_v) when it was rejected (signed) */
                    normalized_residual: number;
                  }[]
                | {
                    /** @description Index of the observation in the request (data row for CSV, 0-based) */
                    index?: number;
                    epoch?: string;
                    satellite?: string;
                    /** @description The residual as sent [m] */
                    residual_m?: number;
                    /** @description Post-fit residual when it was rejected [m] */
                    fitted_residual_m?: number;
                    /** @description Pope τ = v/(σ̂0 σ_v) when it was rejected (signed) */
                    normalized_residual?: number;
                  }[]
                | {
                    [key: string]: (number | string | null)[];
                  };
              statistics: {
                observations_total: number;
                /** @description Dropped for elevation below elevation_cutoff_deg (not errors) */
                observations_below_cutoff: number;
                observations_used: number;
                observations_rejected: number;
                epochs: number;
                zwd_nodes: number;
                gradient_nodes: number;
                /** @description Node values plus one bias per epoch (epoch_bias) */
                unknowns: number;
                /** @description Random-walk and a-priori pseudo-observations */
                constraints: number;
                /** @description observations_used + constraints − unknowns */
                degrees_of_freedom: number;
                /** @description RMS of the post-fit residuals [m] */
                rms_m: number;
                /** @description (vᵀPv + constraint terms) / degrees_of_freedom; null when that is 0 */
                variance_factor: number | null;
                /** @description 1: the variance factor re-weights the observations (scale_sigmas), the formal errors are not multiplied */
                sigma_scale: number;
                /** @description Least-squares solutions computed (re-weightings and screening) */
                solutions: number;
                /** @description false when max_rejections stopped the screening */
                screening_complete: boolean;
                /** @description a of σ² = a² + b²/sin²e in the final solution (re-estimated with scale_sigmas) [m] */
                weighting_constant_m: number;
                /** @description b of σ² = a² + b²/sin²e in the final solution [m] */
                weighting_elevation_m: number;
                /** @description Residuals and rejections per elevation band */
                elevation_bands: {
                  lower_deg: number;
                  upper_deg: number;
                  observations_used: number;
                  observations_rejected: number;
                  /** @description RMS of the post-fit residuals of the band [m] */
                  rms_m: number | null;
                  /** @description RMS of v/σ_v (≈ 1 when the weights fit the band) */
                  normalised_rms: number | null;
                }[];
                /** @description Time correlation of the residuals and its effect on the formal errors; null when correlated_noise is off */
                noise_correlation: {
                  sampling_s: number;
                  /** @description ρ(1), ρ(2), … of the normalised residuals per satellite arc, up to the first insignificant lag */
                  autocorrelation: number[];
                  /** @description Mean factor on the ZWD variances */
                  zwd_variance_inflation: number;
                  /** @description Mean factor on the gradient variances */
                  gradient_variance_inflation: number;
                } | null;
                zwd_nodes_without_data: number;
                gradient_nodes_without_data: number;
              };
              apriori: {
                /** @description A-priori ZHD used for ztd_m [m] */
                zhd_m: number;
                /** @description A-priori ZWD used [m] */
                zwd_m: number;
                /** @enum {string} */
                zhd_source: 'caller' | 'standard-atmosphere';
              };
              /** @description EGM96 geoid undulation N at the site [m]: the standard atmosphere of the default a-priori ZHD and the mapping function get height_m − N */
              geoid_undulation_m: number;
              /** @description The models and settings that produced this result */
              models: {
                [key: string]: string | number | boolean | null;
              };
              /** @description Short hash of `models`: results are homogeneous only when it is equal */
              model_fingerprint: string;
              /** @description Values defaulted or extrapolated, elevations below 3°, and similar */
              warnings: string[];
              station_id: string;
              /**
               * @description Where the met came from: the request's `met`, the station's stored met series, or none (no ZHD/PWV per epoch)
               * @enum {string}
               */
              met_used: 'request' | 'archive' | 'none';
              /** @description The series as stored in the station's delay series (ZTD, ZWD, gradients, sigmas), under this source and the result's model_fingerprint */
              stored: {
                source: string;
                inserted: number;
                updated: number;
                unchanged: number;
              };
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        413: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        415: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        422: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/stations/{station_id}/soundings/{epoch}': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * One stored sounding with its profile and models
     * @description Role needed: read. Reads need a key of role read or above when TROPO_READ_KEYS_REQUIRED=true.
     */
    get: {
      parameters: {
        query?: never;
        header?: never;
        path: {
          /** @description Station identifier: 1-32 characters of letters, digits, "-" and "_" */
          station_id: string;
          /** @description Nominal (launch) epoch of the sounding, ISO 8601 date-time; one sounding per station and epoch */
          epoch: string;
        };
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              station_id: string;
              sounding: {
                /** @description Nominal epoch of the sounding */
                epoch: string;
                /** @description Zenith hydrostatic delay of the column above the station [m] */
                zhd_m: number;
                /** @description Zenith wet delay [m] */
                zwd_m: number;
                /** @description Zenith total delay [m] */
                ztd_m: number;
                /** @description Precipitable water vapour [mm] */
                pwv_mm: number;
                /** @description Weighted mean temperature [K]; null for a dry column */
                tm_k: number | null;
                /** @description Pressure where measured humidity stopped [hPa] (above it humidity was continued climatologically); null when every level carries humidity */
                last_humidity_pressure_hpa: number | null;
                /** @description Levels of the stored profile */
                levels: number;
                /** @description Fingerprint of the models that computed the values */
                model_fingerprint: string;
                /** @description Warnings of the computation, as when it was stored */
                warnings: string[];
                /** @description When the sounding was last written (ISO 8601 UTC) */
                stored_at: string;
              };
              /** @description The models and settings that produced this result */
              models: {
                [key: string]: string | number | boolean | null;
              };
              /** @description The profile as stored (the PUT body, with defaults applied) */
              profile: {
                [key: string]: unknown;
              };
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    /**
     * Store a sounding of a station, with its ZWD, PWV and Tm
     * @description The body is the profile of POST /v1/profile-delays without site and epoch: the station (latitude, longitude, antenna height) is the site, the path gives the epoch, and the column is integrated from the antenna height up by the same code. Humidity may stop above some level; it is then continued climatologically (Smith 1966) and the answer says where measured humidity stopped. One sounding per station and epoch: a second PUT replaces it (201 created, 200 replaced). Needs a write key. Body limit: 4194304 bytes. Role needed: write. Needs `Authorization: Bearer <key>` of role write or admin (401 without a key, 403 with a key of role read or one not accepted).
     */
    put: {
      parameters: {
        query?: never;
        header?: never;
        path: {
          /** @description Station identifier: 1-32 characters of letters, digits, "-" and "_" */
          station_id: string;
          /** @description Nominal (launch) epoch of the sounding, ISO 8601 date-time; one sounding per station and epoch */
          epoch: string;
        };
        cookie?: never;
      };
      requestBody: {
        content: {
          'application/json': {
            /** @description Levels from the surface up: heights strictly increasing, pressures strictly decreasing, top at least 10000 m above the ellipsoid; 5..10000 levels. The column starts at site.height_m (levels below are not used; a profile starting up to 1000 m above the site is extended down) */
            levels: {
              /** @description Height above the WGS84 ellipsoid [m], [-500, 100000] m */
              height_m?: number;
              /** @description Geopotential height above mean sea level in geopotential metres (g0 = 9.80665 m/s²); converted to geometric height with WGS84 normal gravity at the site latitude, then geoid_undulation_m is added [m], [-500, 100000] m */
              geopotential_height_m?: number;
              /** @description Pressure [hPa], (0, 1100] hPa */
              pressure_hpa: number;
              /** @description Air temperature [°C], [-130, 60] °C */
              temperature_c: number;
              /** @description Relative humidity with respect to water [%], [0, 100] % */
              relative_humidity_pct?: number;
              /** @description Dew-point temperature, at most the temperature [°C], [-130, 60] °C */
              dewpoint_c?: number;
              /** @description Water vapour pressure [hPa], [0, 200] hPa */
              vapour_pressure_hpa?: number;
              /** @description Specific humidity [kg/kg], [0, 0.04] kg/kg */
              specific_humidity_kg_kg?: number;
            }[];
            /**
             * @description Refractivity constants k1, k2, k3; one of smith-weintraub-1953, thayer-1974, bevis-1994, rueger-2002-best-average; default bevis-1994
             * @default bevis-1994
             * @enum {string}
             */
            refractivity_constants?: 'smith-weintraub-1953' | 'thayer-1974' | 'bevis-1994' | 'rueger-2002-best-average';
            /**
             * @description Include the inverse compressibility factors of Owens (1967) in the refractivity; default false (ideal gas)
             * @default false
             */
            compressibility?: boolean;
            /** @description Geoid undulation at the site, for geopotential heights; default: EGM96 at the site (the warnings say so) [m], [-120, 100] m */
            geoid_undulation_m?: number;
          };
        };
      };
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              station_id: string;
              /** @description true for a new sounding, false when one of the same epoch was replaced */
              created: boolean;
              sounding: {
                /** @description Nominal epoch of the sounding */
                epoch: string;
                /** @description Zenith hydrostatic delay of the column above the station [m] */
                zhd_m: number;
                /** @description Zenith wet delay [m] */
                zwd_m: number;
                /** @description Zenith total delay [m] */
                ztd_m: number;
                /** @description Precipitable water vapour [mm] */
                pwv_mm: number;
                /** @description Weighted mean temperature [K]; null for a dry column */
                tm_k: number | null;
                /** @description Pressure where measured humidity stopped [hPa] (above it humidity was continued climatologically); null when every level carries humidity */
                last_humidity_pressure_hpa: number | null;
                /** @description Levels of the stored profile */
                levels: number;
                /** @description Fingerprint of the models that computed the values */
                model_fingerprint: string;
                /** @description Warnings of the computation, as when it was stored */
                warnings: string[];
                /** @description When the sounding was last written (ISO 8601 UTC) */
                stored_at: string;
              };
              /** @description How humidity was continued above the last level that carries it (Smith 1966 power law of pressure); null when every level carries humidity */
              humidity_extension: {
                /** @enum {string} */
                method: 'smith-1966-power-law';
                description: string;
                /** @description Index in levels of the last level that carries humidity: measured humidity stops here */
                last_humidity_level: number;
                /** @description Pressure of that level [hPa] */
                last_humidity_pressure_hpa: number;
                /** @description Height of that level above the ellipsoid [m] */
                last_humidity_height_m: number;
                /** @description Specific humidity of that level, q_h [kg/kg] */
                last_humidity_specific_kg_kg: number;
                /** @description Exponent of the power law q = q_h (p / p_h)^lambda [-] */
                lambda: number;
                /** @description Levels above it whose humidity was filled in */
                levels_extended: number;
                /** @description Of those, levels where the law exceeded saturation over water, which was used instead */
                levels_at_saturation: number;
              } | null;
              /** @description The models and settings that produced this result */
              models: {
                [key: string]: string | number | boolean | null;
              };
              /** @description Short hash of `models`: results are homogeneous only when it is equal */
              model_fingerprint: string;
              /** @description Values defaulted or extrapolated, elevations below 3°, and similar */
              warnings: string[];
            };
          };
        };
        /** @description Default Response */
        201: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              station_id: string;
              /** @description true for a new sounding, false when one of the same epoch was replaced */
              created: boolean;
              sounding: {
                /** @description Nominal epoch of the sounding */
                epoch: string;
                /** @description Zenith hydrostatic delay of the column above the station [m] */
                zhd_m: number;
                /** @description Zenith wet delay [m] */
                zwd_m: number;
                /** @description Zenith total delay [m] */
                ztd_m: number;
                /** @description Precipitable water vapour [mm] */
                pwv_mm: number;
                /** @description Weighted mean temperature [K]; null for a dry column */
                tm_k: number | null;
                /** @description Pressure where measured humidity stopped [hPa] (above it humidity was continued climatologically); null when every level carries humidity */
                last_humidity_pressure_hpa: number | null;
                /** @description Levels of the stored profile */
                levels: number;
                /** @description Fingerprint of the models that computed the values */
                model_fingerprint: string;
                /** @description Warnings of the computation, as when it was stored */
                warnings: string[];
                /** @description When the sounding was last written (ISO 8601 UTC) */
                stored_at: string;
              };
              /** @description How humidity was continued above the last level that carries it (Smith 1966 power law of pressure); null when every level carries humidity */
              humidity_extension: {
                /** @enum {string} */
                method: 'smith-1966-power-law';
                description: string;
                /** @description Index in levels of the last level that carries humidity: measured humidity stops here */
                last_humidity_level: number;
                /** @description Pressure of that level [hPa] */
                last_humidity_pressure_hpa: number;
                /** @description Height of that level above the ellipsoid [m] */
                last_humidity_height_m: number;
                /** @description Specific humidity of that level, q_h [kg/kg] */
                last_humidity_specific_kg_kg: number;
                /** @description Exponent of the power law q = q_h (p / p_h)^lambda [-] */
                lambda: number;
                /** @description Levels above it whose humidity was filled in */
                levels_extended: number;
                /** @description Of those, levels where the law exceeded saturation over water, which was used instead */
                levels_at_saturation: number;
              } | null;
              /** @description The models and settings that produced this result */
              models: {
                [key: string]: string | number | boolean | null;
              };
              /** @description Short hash of `models`: results are homogeneous only when it is equal */
              model_fingerprint: string;
              /** @description Values defaulted or extrapolated, elevations below 3°, and similar */
              warnings: string[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        413: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        415: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        422: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    post?: never;
    /**
     * Delete one sounding
     * @description Removes the sounding for good. 404 when the station or the sounding does not exist. Role needed: admin. Needs `Authorization: Bearer <key>` of role admin (401 without a key, 403 with a key of role read or write or one not accepted).
     */
    delete: {
      parameters: {
        query?: never;
        header?: never;
        path: {
          /** @description Station identifier: 1-32 characters of letters, digits, "-" and "_" */
          station_id: string;
          /** @description Nominal (launch) epoch of the sounding, ISO 8601 date-time; one sounding per station and epoch */
          epoch: string;
        };
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Deleted */
        204: {
          headers: {
            [name: string]: unknown;
          };
          content?: never;
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/stations/{station_id}/soundings': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * The soundings of a station in a range, with their ZWD, PWV and Tm
     * @description Without their profiles (GET one sounding for that). Range defaults as for the station series (the maximum range ending at the latest stored delay epoch, or now); one request reads at most 366 days. Role needed: read. Reads need a key of role read or above when TROPO_READ_KEYS_REQUIRED=true.
     */
    get: {
      parameters: {
        query?: {
          /** @description Start of the range, inclusive (ISO 8601 date-time, or a date for 00:00Z of that day). Default: `to` minus the maximum range */
          from?: string;
          /** @description End of the range, inclusive (ISO 8601 date-time, or a date for the whole of that UTC day). Default: `from` plus the maximum range, or the latest stored epoch when neither is given */
          to?: string;
        };
        header?: never;
        path: {
          /** @description Station identifier: 1-32 characters of letters, digits, "-" and "_" */
          station_id: string;
        };
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              station_id: string;
              /** @description Start of the range read (inclusive) */
              from: string;
              /** @description End of the range read (inclusive) */
              to: string;
              /** @description Soundings in the range, by epoch, without their profiles */
              soundings: {
                /** @description Nominal epoch of the sounding */
                epoch: string;
                /** @description Zenith hydrostatic delay of the column above the station [m] */
                zhd_m: number;
                /** @description Zenith wet delay [m] */
                zwd_m: number;
                /** @description Zenith total delay [m] */
                ztd_m: number;
                /** @description Precipitable water vapour [mm] */
                pwv_mm: number;
                /** @description Weighted mean temperature [K]; null for a dry column */
                tm_k: number | null;
                /** @description Pressure where measured humidity stopped [hPa] (above it humidity was continued climatologically); null when every level carries humidity */
                last_humidity_pressure_hpa: number | null;
                /** @description Levels of the stored profile */
                levels: number;
                /** @description Fingerprint of the models that computed the values */
                model_fingerprint: string;
                /** @description Warnings of the computation, as when it was stored */
                warnings: string[];
                /** @description When the sounding was last written (ISO 8601 UTC) */
                stored_at: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/stations/{station_id}/sounding-comparison': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * GNSS minus sounding precipitable water: bias, SD and count, with the pairs
     * @description For each sounding in the range, the station's GNSS PWV (as GET /v1/stations/{station_id}/precipitable-water computes it, default met gap and ZTD σ limit) at the sounding epoch. GNSS PWV records with a PWV and a quality other than met-missing and delay-sigma-large count. When GNSS epochs on both sides of the sounding epoch (or at it) lie within window_s, the GNSS PWV is interpolated linearly in time between them (pairing "interpolated", σ the larger of the two); otherwise the GNSS epoch nearest to the sounding within window_s is taken ("nearest"); otherwise the sounding stays unpaired. Differences are GNSS minus sounding; bias is their mean, sd their sample standard deviation (n − 1), rms their root mean square. Range defaults as for the sounding list; at most 366 days. Role needed: read. Reads need a key of role read or above when TROPO_READ_KEYS_REQUIRED=true.
     */
    get: {
      parameters: {
        query?: {
          /** @description Start of the range, inclusive (ISO 8601 date-time, or a date for 00:00Z of that day). Default: `to` minus the maximum range */
          from?: string;
          /** @description End of the range, inclusive (ISO 8601 date-time, or a date for the whole of that UTC day). Default: `from` plus the maximum range, or the latest stored epoch when neither is given */
          to?: string;
          /** @description Only the delay rows of this source; default: one row per epoch by the source preference of /v1/network/precipitable-water */
          source?: string;
          /** @description Half-width of the pairing window around each sounding epoch [s], [0, 21600]; default 1800 */
          window_s?: number;
        };
        header?: never;
        path: {
          /** @description Station identifier: 1-32 characters of letters, digits, "-" and "_" */
          station_id: string;
        };
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              station_id: string;
              /** @description Start of the range read (inclusive) */
              from: string;
              /** @description End of the range read (inclusive) */
              to: string;
              /** @description Half-width of the pairing window [s] */
              window_s: number;
              /** @description The pairing rule and the statistics, in words */
              pairing: string;
              /** @description Delay sources read, in preference order */
              gnss_sources: string[];
              /** @description GNSS minus sounding PWV over the pairs */
              statistics: {
                /** @description Pairs */
                count: number;
                /** @description Mean of GNSS − sounding PWV [mm]; null without pairs */
                bias_mm: number | null;
                /** @description Sample standard deviation of the differences [mm]; null below 2 pairs */
                sd_mm: number | null;
                /** @description Root mean square of the differences [mm]; null without pairs */
                rms_mm: number | null;
              };
              pairs: {
                /** @description Sounding epoch */
                epoch: string;
                sounding_pwv_mm: number;
                /** @description GNSS PWV at the sounding epoch, by the pairing rule [mm] */
                gnss_pwv_mm: number;
                /** @description Its σ [mm]; null when a ZTD σ is unknown */
                gnss_pwv_sigma_mm: number | null;
                /** @description GNSS − sounding [mm] */
                difference_mm: number;
                /** @enum {string} */
                pairing: 'interpolated' | 'nearest';
                /** @description The GNSS epochs used */
                gnss_epochs: string[];
              }[];
              /** @description Epochs of soundings without GNSS PWV within the window */
              unpaired: string[];
              /** @description GNSS records near the soundings left out by their quality */
              excluded_gnss_records: number;
              warnings: string[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/stations/{station_id}/residuals/{day}': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * The residuals deposited for one station-day
     * @description JSON column arrays sorted by epoch then satellite; `Accept: text/csv` gives the observation CSV. Role needed: read. Reads need a key of role read or above when TROPO_READ_KEYS_REQUIRED=true.
     */
    get: {
      parameters: {
        query?: never;
        header?: never;
        path: {
          /** @description Station identifier: 1-32 characters of letters, digits, "-" and "_" */
          station_id: string;
          /** @description UTC calendar day, YYYY-MM-DD */
          day: string;
        };
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              station_id: string;
              day: string;
              /** @description The deposited observations as column arrays, sorted by epoch then satellite */
              observations: {
                epoch: string[];
                satellite: string[];
                elevation_deg: number[];
                azimuth_deg: number[];
                residual_m: number[];
                /** @description Present when the deposit had sigmas; null on a row without one */
                sigma_m?: (number | null)[];
              };
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    /**
     * Deposit the residuals of one station-day (for campaigns)
     * @description The observations in the forms the estimation routes take: JSON `{observations: [...]}` (objects or column arrays), text/csv (the observation CSV), or an Arrow IPC stream (the table is the observations). Every epoch must lie within the UTC day (400 naming the row otherwise); each (epoch, satellite) once. Stored in a compact form (docs/campaigns.md): replaces a deposit of the same day (201 when new, 200 when replaced). `sha256` is of the canonical stored form, so the same observations sent again give the same digest. Up to 900000 observations. Body limit: 100663296 bytes. Role needed: write. Needs `Authorization: Bearer <key>` of role write or admin (401 without a key, 403 with a key of role read or one not accepted).
     */
    put: {
      parameters: {
        query?: never;
        header?: never;
        path: {
          /** @description Station identifier: 1-32 characters of letters, digits, "-" and "_" */
          station_id: string;
          /** @description UTC calendar day, YYYY-MM-DD */
          day: string;
        };
        cookie?: never;
      };
      requestBody: {
        content: {
          'application/json': {
            /** @description The residuals of one station and one UTC day: every epoch within the day. An array of objects, or an object of column arrays */
            observations:
              | {
                  /**
                   * Format: date-time
                   * @description Epoch, ISO 8601 date-time (UTC, e.g. 2026-03-14T12:00:00Z; an offset is converted to UTC)
                   */
                  epoch: string;
                  /** @description Satellite identifier; each (epoch, satellite) pair may appear once */
                  satellite: string;
                  /** @description Vacuum (geometric) elevation angle; below 3° the answer carries a warning; mapping functions refuse elevations below 1° (a profile is still traced there) [deg], (0, 90] deg */
                  elevation_deg: number;
                  /** @description Azimuth from north through east [deg], [0, 360] deg */
                  azimuth_deg: number;
                  /** @description Residual formed with the a-priori troposphere (observed − computed); may contain a receiver clock [m], [-1000000, 1000000] m */
                  residual_m: number;
                  /** @description Standard deviation of residual_m; absent = from options.weighting and sigma0_m [m], > 0, at most 10 */
                  sigma_m?: number;
                }[]
              | {
                  epoch: string[];
                  satellite: string[];
                  elevation_deg: number[];
                  azimuth_deg: number[];
                  residual_m: number[];
                  sigma_m: number[];
                };
          };
        };
      };
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              station_id: string;
              /** @description UTC day, YYYY-MM-DD */
              day: string;
              observation_count: number;
              /** @description SHA-256 (hex) of the canonical stored form: the same observations sent again give the same digest */
              sha256: string;
              /** @description Size of the stored form [bytes] */
              stored_bytes: number;
            };
          };
        };
        /** @description Default Response */
        201: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              station_id: string;
              /** @description UTC day, YYYY-MM-DD */
              day: string;
              observation_count: number;
              /** @description SHA-256 (hex) of the canonical stored form: the same observations sent again give the same digest */
              sha256: string;
              /** @description Size of the stored form [bytes] */
              stored_bytes: number;
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        413: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        415: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    post?: never;
    /**
     * Delete the residuals of one station-day
     * @description Removes the deposit for good (results stored from it stay). 404 when there is none. Role needed: admin. Needs `Authorization: Bearer <key>` of role admin (401 without a key, 403 with a key of role read or write or one not accepted).
     */
    delete: {
      parameters: {
        query?: never;
        header?: never;
        path: {
          /** @description Station identifier: 1-32 characters of letters, digits, "-" and "_" */
          station_id: string;
          /** @description UTC calendar day, YYYY-MM-DD */
          day: string;
        };
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Deleted */
        204: {
          headers: {
            [name: string]: unknown;
          };
          content?: never;
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/stations/{station_id}/residuals': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * A station's residual deposits: one entry per day
     * @description Optional `start` and `end` (days, inclusive) narrow the list. Role needed: read. Reads need a key of role read or above when TROPO_READ_KEYS_REQUIRED=true.
     */
    get: {
      parameters: {
        query?: {
          /** @description First day listed (inclusive), YYYY-MM-DD */
          start?: string;
          /** @description Last day listed (inclusive), YYYY-MM-DD */
          end?: string;
        };
        header?: never;
        path: {
          /** @description Station identifier: 1-32 characters of letters, digits, "-" and "_" */
          station_id: string;
        };
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              station_id: string;
              days: {
                /** @description UTC day, YYYY-MM-DD */
                day: string;
                observation_count: number;
                /** @description SHA-256 (hex) of the canonical stored form: the same observations sent again give the same digest */
                sha256: string;
                /** @description Size of the stored form [bytes] */
                stored_bytes: number;
                /** @description ISO 8601 UTC of the last deposit */
                stored_at: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/campaigns': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * The campaigns, newest first, with their progress
     * @description Role needed: read. Reads need a key of role read or above when TROPO_READ_KEYS_REQUIRED=true.
     */
    get: {
      parameters: {
        query?: never;
        header?: never;
        path?: never;
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              campaigns: {
                campaign_id: string;
                name: string | null;
                /**
                 * @description finished also when some items failed: the counts say
                 * @enum {string}
                 */
                state: 'queued' | 'running' | 'finished' | 'cancelled';
                start_date: string;
                end_date: string;
                /** @enum {string} */
                residuals: 'deposited' | 'uploaded';
                /** @description Station-windows (hours); null = station-days */
                window: {
                  length_hours: number;
                  step_hours: number;
                } | null;
                /** @description When POST …/uploads-complete closed the uploads (uploaded residuals only) */
                uploads_closed_at: string | null;
                items_total: number;
                /** @description Items whose uploaded residuals have not all arrived (they wait) */
                items_awaiting_residuals: number;
                /** @description Items that got no residuals before the uploads were closed */
                items_no_residuals: number;
                items_done: number;
                items_failed: number;
                items_pending: number;
                items_running: number;
                items_cancelled: number;
                /** @description The fingerprint of the campaign's model set: every result should carry it */
                model_fingerprint: string;
                created_at: string;
                started_at: string | null;
                finished_at: string | null;
                replicas: {
                  /** @description Replica name (TROPODELAY_REPLICA_NAME, else host:pid) */
                  replica: string;
                  items_done: number;
                  /** @description Process CPU time of the replica while it worked on the items it finished [s] */
                  cpu_s: number;
                }[];
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    put?: never;
    /**
     * Submit a reprocessing campaign: one option set over the residuals of stations and days (or windows)
     * @description `residuals: "deposited"` (default): one item per station-day with residuals deposited (PUT /v1/stations/{station_id}/residuals/{day}) in [start_date, end_date] for the stations (all stations with deposits when omitted). `residuals: "uploaded"`: one item per named station and day, awaiting its residuals (PUT /v1/campaigns/{campaign_id}/residuals/{station_id}/{day}); each runs as soon as they have arrived. `window`: station-windows instead of station-days; each item estimates from its whole window and stores its centre `step_hours`. Every item is estimated as by POST /v1/stations/{station_id}/zwd-estimates with `options` and the station's stored met, on any replica, and stored under the source "zwd-estimates" with the campaign's fingerprint, exactly once per epoch. 202 with the campaign; 400 naming the field for bad input; 422 when no station-day in the span has deposited residuals. Body limit: 1048576 bytes. Role needed: write. Needs `Authorization: Bearer <key>` of role write or admin (401 without a key, 403 with a key of role read or one not accepted).
     */
    post: {
      parameters: {
        query?: never;
        header?: never;
        path?: never;
        cookie?: never;
      };
      requestBody: {
        content: {
          'application/json': {
            /** @description A name for people */
            name?: string;
            /** @description The stations; omitted = every station with residuals deposited in the span */
            stations?: string[];
            /** @description First UTC day of the span, YYYY-MM-DD (inclusive) */
            start_date: string;
            /** @description Last UTC day of the span, YYYY-MM-DD (inclusive) */
            end_date: string;
            /**
             * @description The single-station estimation options (those of POST /v1/zwd-estimates, docs/zwd-estimation.md), one set for every item
             * @default {}
             */
            options?: {
              /**
               * @description Spacing Δ of the ZWD nodes of the output, on round UTC epochs jΔ (multiples of Δ since 1970-01-01T00:00Z); with parametrisation "nodes" also the spacing of the piecewise-linear model [s], (0, 2592000] s
               * @default 300
               */
              zwd_interval_s?: number;
              /**
               * @description Random-walk density q of the ZWD: consecutive states x_{j+1} − x_j = 0 ± q √(Δt/1 h) (states at every epoch, or nodes) [m/√h], (0, 10] m/√h; null = no constraint
               * @default 0.01
               */
              zwd_random_walk_m_per_sqrt_h?: number | null;
              /**
               * @description A-priori constraint on the first ZWD node, x_0 = 0 ± σ [m], (0, 10] m; null = none
               * @default 0.5
               */
              zwd_apriori_sigma_m?: number | null;
              /**
               * @description Estimate one free bias per epoch (receiver clock and other common terms); pre-eliminated
               * @default true
               */
              epoch_bias?: boolean;
              /**
               * @description σ_i of observations without sigma_m, σ² = a² + b²/sin²e: "elevation" b = sigma0_m, a = 0; "uniform" a = sigma0_m, b = 0; "elevation-components" b = sigma0_m and a = sigma_constant_m (both re-estimated with scale_sigmas); one of elevation, uniform, elevation-components
               * @default elevation
               * @enum {string}
               */
              weighting?: 'elevation' | 'uniform' | 'elevation-components';
              /**
               * @description σ0 of the weighting scheme (zenith standard deviation of a residual) [m], (0, 1] m
               * @default 0.003
               */
              sigma0_m?: number;
              /**
               * @description Observations below this elevation are dropped (and counted) [deg], [0, 90) deg
               * @default 7
               */
              elevation_cutoff_deg?: number;
              /**
               * @description Reject while the largest |normalised residual| (Pope τ = v/(σ̂0 σ_v)) exceeds k [], [2, 1000]; null = no screening
               * @default 4
               */
              outlier_threshold?: number | null;
              /**
               * @description one-per-solution: reject the largest τ > k, re-solve, repeat. one-per-window: in each iteration also reject the largest τ > k of every stretch more than a window away from the others (nodes: max(3 ZWD intervals, 30 min); every-epoch: the smoother kernel length, 5–30 min; same result at a cost linear in the span); one of one-per-window, one-per-solution
               * @default one-per-window
               * @enum {string}
               */
              outlier_rejection?: 'one-per-window' | 'one-per-solution';
              /**
               * @description Screening stops after this many rejections, with a warning [], [0, 100000]
               * @default 1000
               */
              max_rejections?: number;
              /**
               * @description Re-estimate the observation weights from the residuals (variance components: σ0, or a and b of "elevation-components") and solve again; the random-walk and a-priori constraints keep their sigmas. false = the weights as given
               * @default true
               */
              scale_sigmas?: boolean;
              /**
               * @description a of weighting "elevation-components" (σ² = a² + b²/sin²e), the starting value when scale_sigmas re-estimates it; ignored by the other schemes [m], [0, 1] m; null = sigma0_m / 3
               * @default null
               */
              sigma_constant_m?: number | null;
              /**
               * @description every-epoch: a random-walk state of ZWD and gradients at every epoch, nodes interpolated with the Brownian-bridge variance (formal errors hold at any node spacing). nodes: piecewise linear between the nodes (the variation between nodes is not in σ); one of every-epoch, nodes
               * @default every-epoch
               * @enum {string}
               */
              parametrisation?: 'every-epoch' | 'nodes';
              /**
               * @description Estimate the residuals' time correlation per satellite arc and inflate the formal errors by it (docs/zwd-estimation.md, "Formal errors")
               * @default true
               */
              correlated_noise?: boolean;
              /**
               * @description Wet mapping function of the estimator (src/domain/mapping registry). vmf1 needs per-epoch coefficients in the JSON body's vmf1_coefficients [{epoch, a_h, a_w}], interpolated linearly in time and spanning every observation epoch (a text/csv request cannot carry them); one of niell, vmf1, chao, cosecant
               * @default niell
               * @enum {string}
               */
              wet_mapping?: 'niell' | 'vmf1' | 'chao' | 'cosecant';
              /**
               * @description Longest gap between met records that is interpolated across (the same setting as met_max_gap_s of the station PWV route) [s], (0, 86400] s
               * @default 10800
               */
              met_max_gap_s?: number;
              /** @default {} */
              gradients?: {
                /**
                 * @description Spacing of the gradient nodes of the output (round UTC epochs; with parametrisation "nodes" the model's nodes) [s], (0, 2592000] s
                 * @default 21600
                 */
                interval_s?: number;
                /**
                 * @description Random-walk density q of each gradient component: consecutive states x_{j+1} − x_j = 0 ± q √(Δt/1 h) [m/√h], (0, 10] m/√h; null = no constraint
                 * @default 0.001
                 */
                random_walk_m_per_sqrt_h?: number | null;
                /**
                 * @description A-priori constraint on the first gradient node, x_0 = 0 ± σ [m], (0, 1] m; null = none
                 * @default 0.01
                 */
                apriori_sigma_m?: number | null;
              } | null;
            };
            /**
             * @description "deposited": read from the station archive (PUT /v1/stations/{station_id}/residuals/{day}); "uploaded": sent to the campaign after submission (PUT /v1/campaigns/{campaign_id}/residuals/{station_id}/{day}); `stations` required
             * @default deposited
             * @enum {string}
             */
            residuals?: 'deposited' | 'uploaded';
            /** @description Station-windows instead of station-days: one item per station and window; each stores the centre step_hours of its window (docs/campaigns.md, "Station-windows") */
            window?: {
              /** @description Length of a window: the observations one item estimates from [h], [1, 240] */
              length_hours: number;
              /** @description Step from one window to the next = the part of each window whose estimates are stored (its centre); ≤ length_hours [h], [1, 240] */
              step_hours: number;
            };
          };
        };
      };
      responses: {
        /** @description Default Response */
        202: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              campaign_id: string;
              name: string | null;
              /**
               * @description finished also when some items failed: the counts say
               * @enum {string}
               */
              state: 'queued' | 'running' | 'finished' | 'cancelled';
              start_date: string;
              end_date: string;
              /** @enum {string} */
              residuals: 'deposited' | 'uploaded';
              /** @description Station-windows (hours); null = station-days */
              window: {
                length_hours: number;
                step_hours: number;
              } | null;
              /** @description When POST …/uploads-complete closed the uploads (uploaded residuals only) */
              uploads_closed_at: string | null;
              items_total: number;
              /** @description Items whose uploaded residuals have not all arrived (they wait) */
              items_awaiting_residuals: number;
              /** @description Items that got no residuals before the uploads were closed */
              items_no_residuals: number;
              items_done: number;
              items_failed: number;
              items_pending: number;
              items_running: number;
              items_cancelled: number;
              /** @description The fingerprint of the campaign's model set: every result should carry it */
              model_fingerprint: string;
              created_at: string;
              started_at: string | null;
              finished_at: string | null;
              replicas: {
                /** @description Replica name (TROPODELAY_REPLICA_NAME, else host:pid) */
                replica: string;
                items_done: number;
                /** @description Process CPU time of the replica while it worked on the items it finished [s] */
                cpu_s: number;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        422: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/campaigns/{campaign_id}': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * A campaign's progress: items by state, work per replica
     * @description Role needed: read. Reads need a key of role read or above when TROPO_READ_KEYS_REQUIRED=true.
     */
    get: {
      parameters: {
        query?: never;
        header?: never;
        path: {
          /** @description Campaign id (from POST /v1/campaigns) */
          campaign_id: string;
        };
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              campaign_id: string;
              name: string | null;
              /**
               * @description finished also when some items failed: the counts say
               * @enum {string}
               */
              state: 'queued' | 'running' | 'finished' | 'cancelled';
              start_date: string;
              end_date: string;
              /** @enum {string} */
              residuals: 'deposited' | 'uploaded';
              /** @description Station-windows (hours); null = station-days */
              window: {
                length_hours: number;
                step_hours: number;
              } | null;
              /** @description When POST …/uploads-complete closed the uploads (uploaded residuals only) */
              uploads_closed_at: string | null;
              items_total: number;
              /** @description Items whose uploaded residuals have not all arrived (they wait) */
              items_awaiting_residuals: number;
              /** @description Items that got no residuals before the uploads were closed */
              items_no_residuals: number;
              items_done: number;
              items_failed: number;
              items_pending: number;
              items_running: number;
              items_cancelled: number;
              /** @description The fingerprint of the campaign's model set: every result should carry it */
              model_fingerprint: string;
              created_at: string;
              started_at: string | null;
              finished_at: string | null;
              replicas: {
                /** @description Replica name (TROPODELAY_REPLICA_NAME, else host:pid) */
                replica: string;
                items_done: number;
                /** @description Process CPU time of the replica while it worked on the items it finished [s] */
                cpu_s: number;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/campaigns/{campaign_id}/cancel': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /**
     * Cancel a campaign
     * @description Pending items are not started; running ones finish or are abandoned without storing anything. 409 when the campaign has already finished. Body limit: 1048576 bytes. Role needed: write. Needs `Authorization: Bearer <key>` of role write or admin (401 without a key, 403 with a key of role read or one not accepted).
     */
    post: {
      parameters: {
        query?: never;
        header?: never;
        path: {
          /** @description Campaign id (from POST /v1/campaigns) */
          campaign_id: string;
        };
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              campaign_id: string;
              name: string | null;
              /**
               * @description finished also when some items failed: the counts say
               * @enum {string}
               */
              state: 'queued' | 'running' | 'finished' | 'cancelled';
              start_date: string;
              end_date: string;
              /** @enum {string} */
              residuals: 'deposited' | 'uploaded';
              /** @description Station-windows (hours); null = station-days */
              window: {
                length_hours: number;
                step_hours: number;
              } | null;
              /** @description When POST …/uploads-complete closed the uploads (uploaded residuals only) */
              uploads_closed_at: string | null;
              items_total: number;
              /** @description Items whose uploaded residuals have not all arrived (they wait) */
              items_awaiting_residuals: number;
              /** @description Items that got no residuals before the uploads were closed */
              items_no_residuals: number;
              items_done: number;
              items_failed: number;
              items_pending: number;
              items_running: number;
              items_cancelled: number;
              /** @description The fingerprint of the campaign's model set: every result should carry it */
              model_fingerprint: string;
              created_at: string;
              started_at: string | null;
              finished_at: string | null;
              replicas: {
                /** @description Replica name (TROPODELAY_REPLICA_NAME, else host:pid) */
                replica: string;
                items_done: number;
                /** @description Process CPU time of the replica while it worked on the items it finished [s] */
                cpu_s: number;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        409: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/campaigns/{campaign_id}/report': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * A campaign's report: homogeneity of its results in the archive, exceptions, throughput
     * @description Reads back the fingerprints the archive holds now for every station-day the campaign did: homogeneous when all carry the campaign's fingerprint; a station-day re-estimated later with other options (or gone) is an exception, as is a failed item. Role needed: read. Reads need a key of role read or above when TROPO_READ_KEYS_REQUIRED=true.
     */
    get: {
      parameters: {
        query?: never;
        header?: never;
        path: {
          /** @description Campaign id (from POST /v1/campaigns) */
          campaign_id: string;
        };
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              campaign_id: string;
              /**
               * @description finished also when some items failed: the counts say
               * @enum {string}
               */
              state: 'queued' | 'running' | 'finished' | 'cancelled';
              /** @description Every station-day the campaign did holds results of its fingerprint only */
              homogeneous: boolean;
              model_fingerprint: string;
              /** @description The fingerprints stored now for the items the campaign did, with how many items (station-days, or station-windows) carry each */
              fingerprints: {
                fingerprint: string;
                station_days: number;
              }[];
              /** @description Failed items, items without input (no residuals uploaded, or still awaited), and done items whose stored results differ from the campaign (another fingerprint, or gone) */
              exceptions: {
                station_id: string;
                /** @description The item's day (windows: the day its stored part starts) */
                day: string;
                /** @description Windows: start of the item's stored part (ISO 8601 UTC) */
                kept_from?: string;
                /** @description Windows: end of the item's stored part, exclusive */
                kept_to?: string;
                reason: string;
                fingerprint?: string;
              }[];
              items: {
                total: number;
                awaiting_residuals: number;
                pending: number;
                running: number;
                done: number;
                failed: number;
                cancelled: number;
                no_residuals: number;
              };
              throughput: {
                /** @description Items done per second of wall-clock time from the first claim to the end (or now) */
                station_days_per_s: number | null;
                elapsed_s: number | null;
                per_replica: {
                  /** @description Replica name (TROPODELAY_REPLICA_NAME, else host:pid) */
                  replica: string;
                  items_done: number;
                  /** @description Process CPU time of the replica while it worked on the items it finished [s] */
                  cpu_s: number;
                  /** @description Items done per second of the replica's CPU time */
                  station_days_per_cpu_s: number | null;
                }[];
              };
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/campaigns/{campaign_id}/residuals/{station_id}/{day}': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    /**
     * Upload the residuals of one station-day to a campaign of uploaded residuals
     * @description The body as for PUT /v1/stations/{station_id}/residuals/{day} (JSON objects or column arrays, text/csv, Arrow IPC), with the same rules and stored form; kept with the campaign, not in the station archive. Items whose days have all arrived are queued at once (`items_ready`). The same observations again answer 200 with the same sha256; other observations replace the day while no item reading it has started (409 after). 400 naming params.day outside the span or params.station_id not in the campaign; 409 for a campaign of deposited residuals, a campaign that ended or whose uploads were closed. Up to 900000 observations; body limit 100663296 bytes. Role needed: write. Needs `Authorization: Bearer <key>` of role write or admin (401 without a key, 403 with a key of role read or one not accepted).
     */
    put: {
      parameters: {
        query?: never;
        header?: never;
        path: {
          /** @description Campaign id (from POST /v1/campaigns) */
          campaign_id: string;
          /** @description Station identifier: 1-32 characters of letters, digits, "-" and "_" */
          station_id: string;
          /** @description UTC calendar day, YYYY-MM-DD */
          day: string;
        };
        cookie?: never;
      };
      requestBody: {
        content: {
          'application/json': {
            /** @description The residuals of one station and one UTC day: every epoch within the day. An array of objects, or an object of column arrays */
            observations:
              | {
                  /**
                   * Format: date-time
                   * @description Epoch, ISO 8601 date-time (UTC, e.g. 2026-03-14T12:00:00Z; an offset is converted to UTC)
                   */
                  epoch: string;
                  /** @description Satellite identifier; each (epoch, satellite) pair may appear once */
                  satellite: string;
                  /** @description Vacuum (geometric) elevation angle; below 3° the answer carries a warning; mapping functions refuse elevations below 1° (a profile is still traced there) [deg], (0, 90] deg */
                  elevation_deg: number;
                  /** @description Azimuth from north through east [deg], [0, 360] deg */
                  azimuth_deg: number;
                  /** @description Residual formed with the a-priori troposphere (observed − computed); may contain a receiver clock [m], [-1000000, 1000000] m */
                  residual_m: number;
                  /** @description Standard deviation of residual_m; absent = from options.weighting and sigma0_m [m], > 0, at most 10 */
                  sigma_m?: number;
                }[]
              | {
                  epoch: string[];
                  satellite: string[];
                  elevation_deg: number[];
                  azimuth_deg: number[];
                  residual_m: number[];
                  sigma_m: number[];
                };
          };
        };
      };
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              station_id: string;
              /** @description UTC day, YYYY-MM-DD */
              day: string;
              observation_count: number;
              /** @description SHA-256 (hex) of the canonical stored form: the same observations sent again give the same digest */
              sha256: string;
              /** @description Size of the stored form [bytes] */
              stored_bytes: number;
              campaign_id: string;
              /** @description Items that became pending with this upload (all the days they read have arrived) */
              items_ready: number;
            };
          };
        };
        /** @description Default Response */
        201: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              station_id: string;
              /** @description UTC day, YYYY-MM-DD */
              day: string;
              observation_count: number;
              /** @description SHA-256 (hex) of the canonical stored form: the same observations sent again give the same digest */
              sha256: string;
              /** @description Size of the stored form [bytes] */
              stored_bytes: number;
              campaign_id: string;
              /** @description Items that became pending with this upload (all the days they read have arrived) */
              items_ready: number;
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        409: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        413: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        415: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/campaigns/{campaign_id}/residuals': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * The station-days uploaded to a campaign, with the sha256 of each (what a resumed upload skips)
     * @description Role needed: read. Reads need a key of role read or above when TROPO_READ_KEYS_REQUIRED=true.
     */
    get: {
      parameters: {
        query?: never;
        header?: never;
        path: {
          /** @description Campaign id (from POST /v1/campaigns) */
          campaign_id: string;
        };
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              campaign_id: string;
              days: {
                station_id: string;
                /** @description UTC day, YYYY-MM-DD */
                day: string;
                observation_count: number;
                /** @description SHA-256 (hex) of the canonical stored form: the same observations sent again give the same digest */
                sha256: string;
                /** @description Size of the stored form [bytes] */
                stored_bytes: number;
                /** @description ISO 8601 UTC of the upload */
                stored_at: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/campaigns/{campaign_id}/uploads-complete': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /**
     * Close a campaign's uploads: nothing more will come
     * @description Items with some of their days uploaded run with what has arrived; items with none end as no_residuals and the report lists them. Later uploads are refused (409). 409 for a campaign of deposited residuals. Body limit: 1048576 bytes. Role needed: write. Needs `Authorization: Bearer <key>` of role write or admin (401 without a key, 403 with a key of role read or one not accepted).
     */
    post: {
      parameters: {
        query?: never;
        header?: never;
        path: {
          /** @description Campaign id (from POST /v1/campaigns) */
          campaign_id: string;
        };
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              campaign_id: string;
              name: string | null;
              /**
               * @description finished also when some items failed: the counts say
               * @enum {string}
               */
              state: 'queued' | 'running' | 'finished' | 'cancelled';
              start_date: string;
              end_date: string;
              /** @enum {string} */
              residuals: 'deposited' | 'uploaded';
              /** @description Station-windows (hours); null = station-days */
              window: {
                length_hours: number;
                step_hours: number;
              } | null;
              /** @description When POST …/uploads-complete closed the uploads (uploaded residuals only) */
              uploads_closed_at: string | null;
              items_total: number;
              /** @description Items whose uploaded residuals have not all arrived (they wait) */
              items_awaiting_residuals: number;
              /** @description Items that got no residuals before the uploads were closed */
              items_no_residuals: number;
              items_done: number;
              items_failed: number;
              items_pending: number;
              items_running: number;
              items_cancelled: number;
              /** @description The fingerprint of the campaign's model set: every result should carry it */
              model_fingerprint: string;
              created_at: string;
              started_at: string | null;
              finished_at: string | null;
              replicas: {
                /** @description Replica name (TROPODELAY_REPLICA_NAME, else host:pid) */
                replica: string;
                items_done: number;
                /** @description Process CPU time of the replica while it worked on the items it finished [s] */
                cpu_s: number;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        409: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        503: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/network/precipitable-water': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * PWV and ZTD of many stations in one call (at an epoch, over a range, since an epoch, latest; records or interval means)
     * @description Stations: all, a list (`stations`), or those inside `bbox`. Time: exactly one of `epoch`, `from`/`to`, `since` (exclusive; up to each station's latest delay epoch), `latest=true` (each station's latest delay epoch). Dates alone are whole UTC days.
     *     PWV per record as GET /v1/stations/{station_id}/precipitable-water computes it: met interpolated in time (not across gaps longer than met_max_gap_s) and reduced to the antenna height; ZHD (Saastamoinen/Davis 1985), ZWD = ZTD − ZHD, Tm (Bevis et al. 1992), PWV = Π(Tm)·ZWD (Bevis et al. 1994).
     *     Quality flags, most severe first: met-missing (no PWV), delay-sigma-large (ztd_sigma_m > max_ztd_sigma_m), delay-sigma-unknown (no pwv_sigma_mm), met-interpolated, ok.
     *     Sources: by default one value per station and epoch, from the best-ranked source present at that epoch; a station's sources are ranked by their number of delay rows over the whole UTC day(s) of the range (most first, ties by name) and listed in that order in `stations[].sources`. `source=all` gives every row; `source=<name>` one source.
     *     Aggregation (`interval`, e.g. PT1H): means over [start, start + interval) aligned on 00:00 UTC; see the interval parameter and the intervals[] fields for the method of σ.
     *     Limit: the stations' ranges add up to at most 366 station-days per request (e.g. 1000 stations × 8.8 h). format=csv answers text/csv (an attachment) with the station coordinates on every row; format=netcdf a CF-1.8 timeSeries netCDF file. Role needed: read. Reads need a key of role read or above when TROPO_READ_KEYS_REQUIRED=true.
     */
    get: {
      parameters: {
        query?: {
          /** @description Station ids, comma-separated (at most 2000); default: every station (or those in bbox) */
          stations?: string;
          /** @description Only stations inside this box: west,south,east,north [deg] (WGS84; west > east crosses the 180° meridian) */
          bbox?: string;
          /** @description One epoch (with interval: the interval that holds it). Not with from/to, since or latest */
          epoch?: string;
          /** @description Start of the range, inclusive (date-time, or a date for 00:00Z of that day) */
          from?: string;
          /** @description End of the range, inclusive (date-time, or a date for the whole UTC day); default: from plus the maximum range */
          to?: string;
          /** @description Records after this epoch (exclusive), for regular delivery: pass the last epoch received */
          since?: string;
          /** @description true: each station's latest stored delay epoch (with interval: the interval that holds it) */
          latest?: 'true' | 'false';
          /** @description Regular-interval means instead of records: an ISO 8601 duration (PT1H, PT30M, P1D; 60 s to 1 day, dividing a day). Intervals are [start, start + interval) aligned on 00:00 UTC. Per interval: the mean PWV of the records flagged ok, met-interpolated or delay-sigma-unknown (count), σ of the mean as the mean of their σ (errors taken as fully correlated within the interval: the independent formula would shrink σ by √count), the sample SD of the values, the same for ZTD, and the records per quality flag. With source=all, one mean per source. */
          interval?: string;
          /** @description Default: one value per station and epoch, from the station's preferred source: its sources ranked by their number of delay rows over the whole UTC day(s) of the range (most first, ties by name), the best-ranked source present at each epoch (reported per station as `sources`). "all": every row of every source. A source name: only that source. */
          source?: string;
          /** @description Longest gap between two met records interpolated across [s], [0, 86400]; default 10800 (3 h). The same name as the estimation option */
          met_max_gap_s?: number;
          /** @description ztd_sigma_m above this flags the record "delay-sigma-large" [m]; default 0.01 */
          max_ztd_sigma_m?: number;
          /** @description json (default); csv (an attachment, one header row, station coordinates on every row); netcdf (an attachment: netCDF-3 64-bit offset, CF-1.8 timeSeries, stations × a common time axis, missing values as _FillValue; not with source=all) */
          format?: 'json' | 'csv' | 'netcdf';
        };
        header?: never;
        path?: never;
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              /** @description Earliest start of the stations' ranges */
              from: string;
              /** @description Latest end of the stations' ranges */
              to: string;
              /** @description Length of the intervals [s]; null for records */
              interval_s: number | null;
              /** @description "preferred" (the default), "all" or the one source read */
              source: string;
              stations: {
                station_id: string;
                name: string;
                /** @description Geodetic latitude (WGS84) [deg] */
                latitude_deg: number;
                /** @description Longitude, east positive [deg] */
                longitude_deg: number;
                /** @description Antenna height above the WGS84 ellipsoid [m] */
                height_m: number;
                /** @description Geoid undulation N of EGM96 at the station (height of mean sea level above the ellipsoid) [m], to 1 cm */
                geoid_undulation_m: number;
                /** @description Antenna altitude above mean sea level (the EGM96 geoid): height_m − geoid_undulation_m [m], to 1 cm */
                altitude_m: number;
                /** @description Start of the range read for this station (inclusive); null when nothing was read (latest or since: no delays stored, or none after since) */
                from: string | null;
                /** @description End of the range read for this station (inclusive) */
                to: string | null;
                /** @description Sources of the delay rows read, in preference order (most rows over the UTC day(s) of the range first, ties by name) */
                sources: string[];
                /** @description Records (or intervals) of this station in the answer */
                record_count: number;
              }[];
              /** @description Without interval: one per station and epoch (per source with source=all), ordered by station then epoch */
              records: {
                station_id: string;
                epoch: string;
                /** @description Source of the delay row */
                source: string;
                /** @description Fingerprint of the models of the delay row */
                model_fingerprint: string;
                /** @description Stored zenith total delay [m] */
                ztd_m: number;
                /** @description [m] */
                ztd_sigma_m: number | null;
                /** @description Pressure at the antenna height [hPa] */
                pressure_hpa: number | null;
                /** @description Temperature at the antenna height [°C] */
                temperature_c: number | null;
                /** @description Precipitable water vapour [mm]; null when met is missing */
                pwv_mm: number | null;
                /** @description [mm]; null when PWV or ztd_sigma_m is missing */
                pwv_sigma_mm: number | null;
                /**
                 * @description Most severe first: met-missing (no PWV: no pressure or temperature within met_max_gap_s), delay-sigma-large (ztd_sigma_m > max_ztd_sigma_m), delay-sigma-unknown (no ztd_sigma_m: no pwv_sigma_mm), met-interpolated (met interpolated in time), ok
                 * @enum {string}
                 */
                quality: 'met-missing' | 'delay-sigma-large' | 'delay-sigma-unknown' | 'met-interpolated' | 'ok';
              }[];
              /** @description With interval: one per station and interval holding records (per source with source=all) */
              intervals: {
                station_id: string;
                /** @description Start of the interval (inclusive) */
                epoch: string;
                /** @description End of the interval (exclusive) */
                interval_end: string;
                /** @description Sources of the records in the interval */
                sources: string[];
                /** @description Records whose PWV enters the mean (quality ok, met-interpolated, delay-sigma-unknown) */
                count: number;
                /** @description Records left out of the PWV mean (met-missing, delay-sigma-large) */
                excluded_count: number;
                /** @description Mean PWV [mm]; null when count = 0 */
                pwv_mm: number | null;
                /** @description σ of the mean PWV: mean of the records' σ (errors fully correlated within the interval) [mm]; null when any σ is unknown */
                pwv_sigma_mm: number | null;
                /** @description Sample standard deviation of the PWV values in the interval [mm]; null when count < 2 */
                pwv_sd_mm: number | null;
                /** @description Records whose ZTD enters the mean (all but delay-sigma-large) */
                ztd_count: number;
                /** @description Mean ZTD [m] */
                ztd_m: number | null;
                /** @description σ of the mean ZTD, as for PWV [m] */
                ztd_sigma_m: number | null;
                /** @description Sample standard deviation of ZTD [m] */
                ztd_sd_m: number | null;
                /** @description Records per quality flag */
                quality_counts: {
                  [key: string]: number;
                };
              }[];
              /** @description True when every delay row used comes from one model set */
              homogeneous: boolean;
              model_sets: {
                model_fingerprint: string;
                /** @description The models and settings that produced this result */
                models: {
                  [key: string]: string | number | boolean | null;
                };
                sources: string[];
                first_epoch: string;
                last_epoch: string;
                count: number;
              }[];
              warnings: string[];
              /** @description Models and settings of the PWV retrieval itself (ZHD, Tm, Π, met interpolation) */
              retrieval: {
                /** @description The models and settings that produced this result */
                models: {
                  [key: string]: string | number | boolean | null;
                };
                /** @description Short hash of `models`: results are homogeneous only when it is equal */
                model_fingerprint: string;
                met_max_gap_s: number;
                max_ztd_sigma_m: number;
              };
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/network/coverage': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * Data coverage per station and source: first and last epoch, record count, gaps
     * @description What the archive holds of the delay series (from which PWV is computed), per station and source: first and last epoch, record count, and the gaps — spacings between consecutive records longer than `gap_min_s` (default 1 h).
     *     Stations: all, a list (`stations`) or those inside `bbox`, as for GET /v1/network/precipitable-water; every selected station appears, with `sources: []` when it holds no record in the range.
     *     Computed in the database (aggregates and a window over each series), so a station-year costs one scan, not one row per record through the service. Gaps before the first or after the last record of the range are not counted (first_epoch and last_epoch show them). Role needed: read. Reads need a key of role read or above when TROPO_READ_KEYS_REQUIRED=true.
     */
    get: {
      parameters: {
        query?: {
          /** @description Station ids, comma-separated (at most 2000); default: every station (or those in bbox) */
          stations?: string;
          /** @description Only stations inside this box: west,south,east,north [deg] (WGS84; west > east crosses the 180° meridian) */
          bbox?: string;
          /** @description Only records at or after this epoch (a date: 00:00Z of that day); default: the first stored */
          from?: string;
          /** @description Only records at or before this epoch (a date: the whole UTC day); default: the last stored */
          to?: string;
          /** @description A gap is a spacing between two consecutive records of one station and source longer than this [s]; default 3600 (1 h), range [60, 31622400] */
          gap_min_s?: number;
          /** @description Most gaps listed per station and source: the longest, in time order (all are counted in gap_count); default 20 */
          max_gaps?: number;
        };
        header?: never;
        path?: never;
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              /** @description Start of the range looked at; null: from the first stored record */
              from: string | null;
              /** @description End of the range looked at; null: to the last stored record */
              to: string | null;
              gap_min_s: number;
              max_gaps: number;
              /**
               * @description The series looked at: the stored delays (ZTD), from which PWV is computed
               * @enum {string}
               */
              series: 'delays';
              stations: {
                station_id: string;
                name: string;
                /** @description Geodetic latitude (WGS84) [deg] */
                latitude_deg: number;
                /** @description Longitude, east positive [deg] */
                longitude_deg: number;
                /** @description Antenna height above the WGS84 ellipsoid [m] */
                height_m: number;
                /** @description Geoid undulation N of EGM96 at the station (height of mean sea level above the ellipsoid) [m], to 1 cm */
                geoid_undulation_m: number;
                /** @description Antenna altitude above mean sea level (the EGM96 geoid): height_m − geoid_undulation_m [m], to 1 cm */
                altitude_m: number;
                /** @description One entry per source with records in the range, by source name; empty: none */
                sources: {
                  source: string;
                  first_epoch: string;
                  last_epoch: string;
                  record_count: number;
                  /** @description Gaps longer than gap_min_s between first_epoch and last_epoch */
                  gap_count: number;
                  /** @description Sum of their lengths [s] */
                  gap_total_s: number;
                  /** @description The longest max_gaps of them, in time order */
                  gaps: {
                    /** @description Epoch of the last record before the gap */
                    from: string;
                    /** @description Epoch of the first record after the gap */
                    to: string;
                    /** @description to − from [s] */
                    length_s: number;
                  }[];
                }[];
              }[];
              summary: {
                station_count: number;
                stations_with_records: number;
                /** @description Station–source pairs with records */
                source_series: number;
                record_count: number;
                gap_count: number;
                first_epoch: string | null;
                last_epoch: string | null;
              };
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/profile-delays': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /**
     * Zenith delays, precipitable water, Tm and ray-traced mapping factors from an atmospheric profile
     * @description Integrates a vertical profile (radiosonde ascent or weather-model column) from the site height up: refractivity N = k1 Pd/T + k2 e/T + k3 e/T² (constant sets of Smith & Weintraub 1953, Thayer 1974, Bevis et al. 1994, Rüeger 2002), ZHD = 1e-6 k1 Rd ∫dP/g with WGS84 normal gravity, ZWD = 1e-6 ∫N_w dz, PWV = ∫ρv dz/ρw, Tm = ∫(e/T)dz/∫(e/T²)dz. Rays are traced through spherical shells (n r cos θ = const) at vacuum elevations, iterating on the launch angle; the slant delay is the optical path minus the projection of station-to-exit onto the outgoing direction, and its bending term is assigned to the hydrostatic part. Mapping factors (slant / zenith of the same column) are set beside those of mapping_model. Body limit: 4194304 bytes (4 MiB).
     */
    post: {
      parameters: {
        query?: never;
        header?: never;
        path?: never;
        cookie?: never;
      };
      requestBody: {
        content: {
          'application/json': {
            /** @description Site: geodetic coordinates on WGS84 */
            site: {
              /** @description Geodetic latitude [deg], [-90, 90] deg */
              latitude_deg: number;
              /** @description Longitude, east positive [deg], [-180, 360] deg */
              longitude_deg: number;
              /** @description Height above the WGS84 ellipsoid [m], [-500, 9000] m */
              height_m: number;
            };
            /**
             * Format: date-time
             * @description Epoch, ISO 8601 date-time (UTC, e.g. 2026-03-14T12:00:00Z; an offset is converted to UTC)
             */
            epoch: string;
            /** @description Levels from the surface up: heights strictly increasing, pressures strictly decreasing, top at least 10000 m above the ellipsoid; 5..10000 levels. The column starts at site.height_m (levels below are not used; a profile starting up to 1000 m above the site is extended down) */
            levels: {
              /** @description Height above the WGS84 ellipsoid [m], [-500, 100000] m */
              height_m?: number;
              /** @description Geopotential height above mean sea level in geopotential metres (g0 = 9.80665 m/s²); converted to geometric height with WGS84 normal gravity at the site latitude, then geoid_undulation_m is added [m], [-500, 100000] m */
              geopotential_height_m?: number;
              /** @description Pressure [hPa], (0, 1100] hPa */
              pressure_hpa: number;
              /** @description Air temperature [°C], [-130, 60] °C */
              temperature_c: number;
              /** @description Relative humidity with respect to water [%], [0, 100] % */
              relative_humidity_pct?: number;
              /** @description Dew-point temperature, at most the temperature [°C], [-130, 60] °C */
              dewpoint_c?: number;
              /** @description Water vapour pressure [hPa], [0, 200] hPa */
              vapour_pressure_hpa?: number;
              /** @description Specific humidity [kg/kg], [0, 0.04] kg/kg */
              specific_humidity_kg_kg?: number;
            }[];
            /**
             * @description Refractivity constants k1, k2, k3; one of smith-weintraub-1953, thayer-1974, bevis-1994, rueger-2002-best-average; default bevis-1994
             * @default bevis-1994
             * @enum {string}
             */
            refractivity_constants?: 'smith-weintraub-1953' | 'thayer-1974' | 'bevis-1994' | 'rueger-2002-best-average';
            /**
             * @description Include the inverse compressibility factors of Owens (1967) in the refractivity; default false (ideal gas)
             * @default false
             */
            compressibility?: boolean;
            /** @description Vacuum (geometric) elevations to trace rays at [deg], (0, 90], 1..100; absent = no slants */
            elevations_deg?: number[];
            /**
             * @description Mapping function set beside the traced factors; default niell
             * @default niell
             * @enum {string}
             */
            mapping_model?: 'niell' | 'vmf1' | 'chao' | 'cosecant';
            /** @description Coefficients for model "vmf1", from the VMF1 grids or site files for the epoch */
            coefficients?: {
              /** @description VMF1 hydrostatic a coefficient [], [0.0005, 0.002] */
              ah: number;
              /** @description VMF1 wet a coefficient [], [0, 0.001] */
              aw: number;
              /**
               * @description What ah refers to: "sea-level" (grid coefficients: Niell's height correction is added from the site's height above sea level) or "site" (coefficients computed at the site: no height correction). Absent: "sea-level", with a warning
               * @enum {string}
               */
              height_reference?: 'site' | 'sea-level';
            };
            /** @description Geoid undulation at the site, for geopotential heights; default: EGM96 at the site (the warnings say so) [m], [-120, 100] m */
            geoid_undulation_m?: number;
          };
        };
      };
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              /** @description Zenith hydrostatic delay, 1e-6 k1 Rd ∫dP/g with normal gravity [m] */
              zhd_m: number;
              /** @description Zenith wet delay, 1e-6 ∫N_w dz [m] */
              zwd_m: number;
              /** @description Zenith total delay [m] */
              ztd_m: number;
              /** @description Precipitable water vapour, ∫ρv dz / ρw [mm] */
              pwv_mm: number;
              /** @description Weighted mean temperature ∫(e/T)dz / ∫(e/T²)dz [K]; null for a dry column */
              tm_k: number | null;
              /** @description How the column was continued above the top level */
              top_extension: {
                /** @enum {string} */
                method: 'dry-isothermal-hydrostatic';
                description: string;
                /** @description Height of the top level [m] */
                top_height_m: number;
                /** @description Pressure at the top level [hPa] */
                top_pressure_hpa: number;
                /** @description Temperature of the extension (that of the top level) [°C] */
                top_temperature_c: number;
                /** @description Scale height Rd T / g at the top [m] */
                scale_height_m: number;
                /** @description Height where the extension stops (pressure below 1e-6 of the surface pressure) [m] */
                ceiling_height_m: number;
                /** @description Part of zhd_m above the top level [m] */
                zhd_m: number;
                /** @description zhd_m of the extension / zhd_m [-] */
                zhd_fraction: number;
                /** @description Part of zwd_m above the top level [m]: 0, the extension is dry */
                zwd_m: number;
              };
              /** @description The column as computed */
              column: {
                /** @description Bottom of the column: the site height [m] */
                bottom_height_m: number;
                /** @description Top level [m] */
                top_height_m: number;
                /** @description Pressure at the site height [hPa] */
                surface_pressure_hpa: number;
                /** @description Temperature at the site height [°C] */
                surface_temperature_c: number;
                /** @description Levels of the request inside the column */
                levels_used: number;
                /** @description Levels below the site height, not used */
                levels_below_site: number;
                /** @description How far the profile was extended down to the site [m]; 0 if it reached it */
                extended_down_m: number;
                /** @description Spherical shells the column was divided into */
                shells: number;
                /** @description Radius of the shells’ centre: Gaussian mean radius of curvature at the site [m] */
                earth_radius_m: number;
                /** @description Mean gravity of the column, surface pressure / ∫dP/g [m/s²] */
                mean_gravity_m_s2: number;
                /** @description 1e-6 ∫N_h dz over the given heights [m]; equals zhd_m when heights and pressures are in hydrostatic balance */
                zhd_height_integral_m: number;
              };
              /** @description How humidity was continued above the last level that carries it (Smith 1966 power law of pressure); null when every level carries humidity */
              humidity_extension: {
                /** @enum {string} */
                method: 'smith-1966-power-law';
                description: string;
                /** @description Index in levels of the last level that carries humidity: measured humidity stops here */
                last_humidity_level: number;
                /** @description Pressure of that level [hPa] */
                last_humidity_pressure_hpa: number;
                /** @description Height of that level above the ellipsoid [m] */
                last_humidity_height_m: number;
                /** @description Specific humidity of that level, q_h [kg/kg] */
                last_humidity_specific_kg_kg: number;
                /** @description Exponent of the power law q = q_h (p / p_h)^lambda [-] */
                lambda: number;
                /** @description Levels above it whose humidity was filled in */
                levels_extended: number;
                /** @description Of those, levels where the law exceeded saturation over water, which was used instead */
                levels_at_saturation: number;
              } | null;
              /** @description One per elevations_deg, in order; absent when no elevations were requested */
              slants?: {
                /** @description Vacuum (geometric) elevation of the outgoing ray [deg], as requested */
                elevation_deg: number;
                /** @description Launch (apparent) elevation of the ray at the antenna [deg] */
                apparent_elevation_deg: number;
                /** @description Refraction angle, apparent minus vacuum elevation [deg] */
                refraction_deg: number;
                /** @description Slant hydrostatic delay including the geometric bending term [m] (= mapping_hydrostatic · zhd_m) */
                hydrostatic_m: number;
                /** @description Slant wet delay [m] (= mapping_wet · zwd_m) */
                wet_m: number;
                /** @description Slant total delay [m] */
                total_m: number;
                /** @description Geometric bending term, ray length minus the projection of station-to-exit onto the outgoing direction [m]; part of hydrostatic_m */
                bending_m: number;
                /** @description Ray-traced hydrostatic mapping factor [-] */
                mapping_hydrostatic: number;
                /** @description Ray-traced wet mapping factor [-]; null for a dry column */
                mapping_wet: number | null;
                /** @description Hydrostatic mapping factor of mapping_model at the vacuum elevation [-]; null below 1°, where mapping functions are not evaluated */
                model_mapping_hydrostatic: number | null;
                /** @description Wet mapping factor of mapping_model at the vacuum elevation [-]; null below 1° */
                model_mapping_wet: number | null;
              }[];
              /** @description The mapping function of model_mapping_* */
              mapping_model: string;
              /** @description The models and settings that produced this result */
              models: {
                [key: string]: string | number | boolean | null;
              };
              /** @description Short hash of `models`: results are homogeneous only when it is equal */
              model_fingerprint: string;
              /** @description Values defaulted or extrapolated, elevations below 3°, and similar */
              warnings: string[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        413: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        415: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        422: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/admin/keys': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * List the API keys
     * @description Configured keys and keys stored in the database, revoked ones included, by name. Never a secret. Role needed: admin. Needs `Authorization: Bearer <key>` of role admin (401 without a key, 403 with a key of role read or write or one not accepted).
     */
    get: {
      parameters: {
        query?: never;
        header?: never;
        path?: never;
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              /** @description Every key by name; secrets are never shown */
              keys: {
                name: string;
                /**
                 * @description read: the archive reads; write: also uploads and station changes; admin: also deletes, keys, audit, restore and purge
                 * @enum {string}
                 */
                role: 'read' | 'write' | 'admin';
                /**
                 * @description configuration: TROPODELAY_API_KEYS (or its file); database: created through the API
                 * @enum {string}
                 */
                origin: 'configuration' | 'database';
                /** @description ISO 8601 UTC; null for configured keys */
                created_at: string | null;
                /** @description Name of the key that created it; null for configured keys and the first admin key */
                created_by: string | null;
                /** @description ISO 8601 UTC; null while valid */
                revoked_at: string | null;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    put?: never;
    /**
     * Create an API key
     * @description Stores a new key with a name and a role in the database (every replica on it accepts the key within 10 s). The answer holds the secret: it is shown this once and stored only as its SHA-256 digest. A name in use, also by a revoked or a configured key, is a 409. Body limit: 1048576 bytes. Role needed: admin. Needs `Authorization: Bearer <key>` of role admin (401 without a key, 403 with a key of role read or write or one not accepted).
     */
    post: {
      parameters: {
        query?: never;
        header?: never;
        path?: never;
        cookie?: never;
      };
      requestBody: {
        content: {
          'application/json': {
            /** @description Name of a key: shown in the audit trail and the request log */
            name: string;
            /**
             * @description read: the archive reads; write: also uploads and station changes; admin: also deletes, keys, audit, restore and purge
             * @enum {string}
             */
            role: 'read' | 'write' | 'admin';
          };
        };
      };
      responses: {
        /** @description Default Response */
        201: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              name: string;
              /**
               * @description read: the archive reads; write: also uploads and station changes; admin: also deletes, keys, audit, restore and purge
               * @enum {string}
               */
              role: 'read' | 'write' | 'admin';
              /**
               * @description configuration: TROPODELAY_API_KEYS (or its file); database: created through the API
               * @enum {string}
               */
              origin: 'configuration' | 'database';
              /** @description ISO 8601 UTC; null for configured keys */
              created_at: string | null;
              /** @description Name of the key that created it; null for configured keys and the first admin key */
              created_by: string | null;
              /** @description ISO 8601 UTC; null while valid */
              revoked_at: string | null;
              /** @description The bearer secret: shown in this answer only, stored as a SHA-256 digest */
              secret: string;
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        409: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        415: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/admin/keys/{key_name}': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    post?: never;
    /**
     * Revoke an API key
     * @description Marks a stored key revoked: refused at once by this replica, by the others within 10 s. Its name stays in the list and the audit trail. A configured key is a 409 (remove it from the configuration). Role needed: admin. Needs `Authorization: Bearer <key>` of role admin (401 without a key, 403 with a key of role read or write or one not accepted).
     */
    delete: {
      parameters: {
        query?: never;
        header?: never;
        path: {
          /** @description Name of a key: shown in the audit trail and the request log */
          key_name: string;
        };
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Revoked */
        204: {
          headers: {
            [name: string]: unknown;
          };
          content?: never;
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        409: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/audit': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * Read the audit trail of writes
     * @description One event per write request made with an accepted key (PUT/DELETE of stations, uploads, stored estimations, restores, purges, key changes), refused ones included: key name, client address, route, station, source, record counts, status, time. Newest first. Events older than TROPODELAY_AUDIT_RETENTION_DAYS are deleted by the hourly retention run (0 = kept forever). Role needed: admin. Needs `Authorization: Bearer <key>` of role admin (401 without a key, 403 with a key of role read or write or one not accepted).
     */
    get: {
      parameters: {
        query?: {
          /** @description Earliest event time (inclusive); ISO 8601 date-time or a date */
          from?: string;
          /** @description Latest event time (inclusive); ISO 8601 date-time or a date (its whole day) */
          to?: string;
          /** @description Only events of this station */
          station?: string;
          /** @description Only events made with this key */
          key_name?: string;
          /** @description Most events returned, newest first (default 100) */
          limit?: number;
        };
        header?: never;
        path?: never;
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              events: {
                event_id: number;
                /** @description ISO 8601 UTC time of the answer */
                at: string;
                /** @description Name of the key presented (accepted keys only) */
                key_name: string | null;
                /** @description Client address as seen through the trusted proxies (TRUST_PROXY) */
                client_address: string;
                method: string;
                /** @description Route pattern, e.g. /v1/stations/:station_id/met */
                route: string;
                path: string;
                station_id: string | null;
                source: string | null;
                /** @description Records received (stored and rejected) */
                records: number | null;
                inserted: number | null;
                updated: number | null;
                unchanged: number | null;
                /** @description HTTP status of the answer */
                status: number;
                request_id: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/admin/deleted-stations': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * List the deleted stations
     * @description Stations marked deleted and still restorable, oldest first, with the time after which the purge removes them. Role needed: admin. Needs `Authorization: Bearer <key>` of role admin (401 without a key, 403 with a key of role read or write or one not accepted).
     */
    get: {
      parameters: {
        query?: never;
        header?: never;
        path?: never;
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              /** @description Days a deleted station stays restorable (TROPODELAY_DELETE_RETENTION_DAYS) */
              retention_days: number;
              stations: {
                station_id: string;
                name: string;
                /** @description ISO 8601 UTC */
                deleted_at: string;
                /** @description ISO 8601 UTC: the purge removes it at its first run after this time */
                purge_after: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/stations/{station_id}/restore': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /**
     * Restore a deleted station
     * @description Clears the deletion mark of a station not yet purged: it and its series are visible again, unchanged. Body limit: 1048576 bytes. Role needed: admin. Needs `Authorization: Bearer <key>` of role admin (401 without a key, 403 with a key of role read or write or one not accepted).
     */
    post: {
      parameters: {
        query?: never;
        header?: never;
        path: {
          /** @description Station identifier: 1-32 characters of letters, digits, "-" and "_" */
          station_id: string;
        };
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              station_id: string;
              name: string;
              /** @description Geodetic latitude (WGS84) [deg] */
              latitude_deg: number;
              /** @description Longitude, east positive [deg] */
              longitude_deg: number;
              /** @description Antenna height above the WGS84 ellipsoid [m] */
              height_m: number;
              /** @description Geoid undulation N of EGM96 at the station (height of mean sea level above the ellipsoid) [m], to 1 cm */
              geoid_undulation_m: number;
              /** @description Antenna altitude above mean sea level (the EGM96 geoid): height_m − geoid_undulation_m [m], to 1 cm */
              altitude_m: number;
              /** @description [m]; null = at the antenna height */
              met_height_m: number | null;
              description: string | null;
              created_at: string;
              updated_at: string;
              /** @description Where the station series are read */
              links: {
                met: string;
                delays: string;
                precipitable_water: string;
              };
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        400: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        404: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        415: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/v1/admin/purge': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /**
     * Purge the stations deleted longer ago than the retention period, and trim the audit trail
     * @description Runs now what runs hourly: removes for good every station marked deleted at or before now minus TROPODELAY_DELETE_RETENTION_DAYS, with its series, then deletes the audit events stored before now minus TROPODELAY_AUDIT_RETENTION_DAYS (none when it is 0), in batches. Running it again, or on several replicas at once, deletes nothing twice. To remove one station at once, DELETE /v1/stations/{station_id}?purge=true. Body limit: 1048576 bytes. Role needed: admin. Needs `Authorization: Bearer <key>` of role admin (401 without a key, 403 with a key of role read or write or one not accepted).
     */
    post: {
      parameters: {
        query?: never;
        header?: never;
        path?: never;
        cookie?: never;
      };
      requestBody?: never;
      responses: {
        /** @description Default Response */
        200: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              /** @description Ids of the stations removed for good with their series */
              purged: string[];
              /** @description Stations marked deleted at or before this time (ISO 8601 UTC) were purged */
              cutoff: string;
              /** @description Audit events deleted by this run (older than TROPODELAY_AUDIT_RETENTION_DAYS) */
              audit_events_trimmed: number;
              /** @description Audit events stored before this time (ISO 8601 UTC) were deleted; null when the audit trail is kept forever (0 days) */
              audit_events_cutoff: string | null;
              /** @description Days an audit event is kept (TROPODELAY_AUDIT_RETENTION_DAYS); 0 = forever */
              audit_retention_days: number;
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        401: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        403: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
        /** @description RFC 9457 problem details (application/problem+json) */
        415: {
          headers: {
            [name: string]: unknown;
          };
          content: {
            'application/json': {
              type: string;
              title: string;
              status: number;
              detail: string;
              instance?: string;
              /** @description One entry per offending field, with its allowed range */
              errors?: {
                field: string;
                message: string;
              }[];
            };
          };
        };
      };
    };
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
}
export type webhooks = Record<string, never>;
export interface components {
  schemas: never;
  responses: never;
  parameters: never;
  requestBodies: never;
  headers: never;
  pathItems: never;
}
export type $defs = Record<string, never>;
export type operations = Record<string, never>;
