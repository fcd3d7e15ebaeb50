// Fleet hot spots: pure binning, density, rates, the repeat rule and the stand-out test.
export * from './grid';
export * from './density';
export * from './poisson';
export * from './rates';
export * from './repeats';
export * from './rows';
export * from './stand-out';
export * from './trend';
