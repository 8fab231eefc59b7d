// Every number a learner reads goes through here: money, stops, EV, mireds, kelvin, lengths (browser-safe, no imports).
export * from './money';
export * from './numbers';
