/** Public API of the evidence engine (pure TypeScript, no I/O). */
export * from './types';
export * from './thresholds';
export * from './units';
export * from './normalise';
export * from './outcome';
export * from './wilson';
export * from './ceiling';
export * from './survival';
export * from './cautions';
export * from './certainty';
export * from './verdict';
export * from './derivation';
export * from './aggregate';
export * from './blend';
export * from './bin-size';
export * from './comfort';
export * from './reference-materials';
