export { NotFoundScreen as default } from '../components/NotFoundScreen';
