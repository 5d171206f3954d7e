import { provideAppIcons } from './app/icons/provide-app-icons';

/** Providers every web component test gets (angular.json test `providersFile`): the app's icons. */
export default [provideAppIcons()];
