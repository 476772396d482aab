/** Design files: parsing, validation and unit conversion into solver problems. */
export * from './units.ts';
export * from './schema.ts';
export * from './design.ts';
