export { OverviewScreen as default } from '../../components/overview/OverviewScreen';
