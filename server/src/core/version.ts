/** The version reported by the CLI, the server and SARIF output (kept equal to package.json by a test). */
export const PNEUMARK_VERSION = '0.1.0';
