// The orientation lab's pure core: prompt templates, seeded prompt generation, grading through the
// orientation engine, explanations and result summaries.
export * from './rng';
export * from './templates';
export * from './types';
export * from './prompts';
export * from './grade';
export * from './flip-steps';
export * from './results';
export * from './words';
