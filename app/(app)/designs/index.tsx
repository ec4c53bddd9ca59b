export { DesignListScreen as default } from '../../../components/design/DesignListScreen';
