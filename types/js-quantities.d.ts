declare module "js-quantities" {
  interface Quantity {
    scalar: number;
    to(unit: string): Quantity;
  }
  function Qty(value: string): Quantity;
  export default Qty;
}
