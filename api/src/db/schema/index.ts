export * from './audit.js';
export * from './companies.js';
export * from './mail.js';
export * from './users.js';
