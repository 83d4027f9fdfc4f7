// A walk on the phone: words, gaps, the device form and the instant advice. Pure, like the rest of survey/.
export * from './words';
export * from './gaps';
export * from './device-form';
export * from './advice';
export * from './describe';
export * from './walk';
