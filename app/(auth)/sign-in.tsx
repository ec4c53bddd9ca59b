export { SignInScreen as default } from '../../components/auth/SignInScreen';
