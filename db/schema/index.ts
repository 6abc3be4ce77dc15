export * from './enums';
export * from './columns';
export * from './users';
export * from './alloys';
export * from './coupons';
export * from './photos';
export * from './classes';
export * from './settings';
