export { MembersScreen as default } from '../../components/members/MembersScreen';
