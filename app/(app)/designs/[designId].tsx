export { DesignRouteScreen as default } from '../../../components/design/routes';
