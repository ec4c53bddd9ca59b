export { AboutScreen as default } from '../../components/about/AboutScreen';
