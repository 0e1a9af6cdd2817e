/** Service version, reported in the OpenAPI document. Kept in step with package.json by a test. */
export const SERVICE_VERSION = '0.1.0';
