export { ImplementationRouteScreen as default } from '../../../components/implementation/ImplementationScreen';
