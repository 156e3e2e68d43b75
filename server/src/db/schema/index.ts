export * from './users'
