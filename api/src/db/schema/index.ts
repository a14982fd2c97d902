export * from './companies.js';
