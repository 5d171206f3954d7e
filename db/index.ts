/** Public API of the data layer. Import it only as `@gapwise/db`. */
export {
  createDataSource,
  DEFAULT_DATABASE_URL,
  entities,
  migrationState,
  type DataSourceOptions,
} from './data-source';
export * from './entities/index';
export { migrations } from './migrations/index';
