/**
 * The one more part of @lhncbc/ucum-lhc the export tests use: `validateUnitString`, which reads a
 * UCUM code without converting it, so special units such as [pH] (which `convertUnitTo` cannot
 * convert) are checked too. Merges with tests/physiology/ucum-lhc.d.ts.
 */
declare module '@lhncbc/ucum-lhc' {
  export interface UcumValidation {
    readonly status: 'valid' | 'invalid' | 'error';
    readonly ucumCode: string | null;
    readonly msg: readonly string[];
  }
  export interface UcumLhcUtils {
    validateUnitString(unit: string, suggest?: boolean): UcumValidation;
  }
}
