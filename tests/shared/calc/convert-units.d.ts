// convert-units 2.x ships no types; only the chain the tests use is declared.
declare module 'convert-units' {
  type Converter = { from(unit: string): { to(unit: string): number } };
  export default function convert(value: number): Converter;
}
