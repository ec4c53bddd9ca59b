export { NewDesignScreen as default } from '../../../components/design/routes';
