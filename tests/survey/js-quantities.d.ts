// Minimal local typings for the js-quantities test oracle (the package ships none).
declare module 'js-quantities' {
  interface Qty {
    readonly scalar: number;
    to(unit: string): Qty;
    mul(other: Qty | number): Qty;
    div(other: Qty | number): Qty;
    add(other: Qty): Qty;
    sub(other: Qty): Qty;
    units(): string;
  }
  function Qty(value: string | number, unit?: string): Qty;
  export default Qty;
}
