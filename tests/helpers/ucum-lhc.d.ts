/**
 * Minimal typing for the parts of @lhncbc/ucum-lhc (a general-purpose UCUM library, which ships no
 * TypeScript declarations) that the tests use: `convertUnitTo` to cross-check unit conversions
 * (physiology, kPa readings; between mass and substance concentrations given a molecular weight), and `validateUnitString`, which reads a UCUM code without converting
 * it, so special units such as [pH] (which `convertUnitTo` cannot convert) are checked too (exports).
 */
declare module '@lhncbc/ucum-lhc' {
  export interface UcumConversionResult {
    readonly status: 'succeeded' | 'failed' | 'error';
    readonly toVal: number | null;
    readonly msg: readonly string[];
  }
  export interface UcumValidation {
    readonly status: 'valid' | 'invalid' | 'error';
    readonly ucumCode: string | null;
    readonly msg: readonly string[];
  }
  export class UcumLhcUtils {
    static getInstance(): UcumLhcUtils;
    convertUnitTo(fromUnitCode: string, fromVal: number, toUnitCode: string, options?: { readonly molecularWeight?: number }): UcumConversionResult;
    validateUnitString(unit: string, suggest?: boolean): UcumValidation;
  }
}
