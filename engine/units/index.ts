// Units: exact definitions (NIST) and the parser for what people type.
export * from './definitions.js';
export { type ParsedUnit, parseQuantity, parseUnit, type Quantity, type QuantityKind } from './parse.js';
