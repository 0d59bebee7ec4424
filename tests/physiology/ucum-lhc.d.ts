/**
 * Minimal typing for the parts of @lhncbc/ucum-lhc (a general-purpose UCUM library, which ships
 * no TypeScript declarations) that the physiology tests use to cross-check unit conversions.
 */
declare module '@lhncbc/ucum-lhc' {
  export interface UcumConversionResult {
    readonly status: 'succeeded' | 'failed' | 'error';
    readonly toVal: number | null;
    readonly msg: readonly string[];
  }
  export class UcumLhcUtils {
    static getInstance(): UcumLhcUtils;
    convertUnitTo(fromUnitCode: string, fromVal: number, toUnitCode: string): UcumConversionResult;
  }
}
