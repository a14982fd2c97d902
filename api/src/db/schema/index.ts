export * from './audit.js';
export * from './companies.js';
export * from './customers.js';
export * from './jobs.js';
export * from './mail.js';
export * from './sites.js';
export * from './users.js';
