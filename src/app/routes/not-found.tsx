export { NotFoundPage as Component } from '../not-found';
