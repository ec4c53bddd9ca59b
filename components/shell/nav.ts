import type { ComponentType } from 'react';
import { DesignsIcon, MembersIcon, OverviewIcon, type IconProps } from '../ui/icons';

export interface NavItem {
  href: '/' | '/designs' | '/members';
  label: string;
  Icon: ComponentType<IconProps>;
  testID: string;
  /** whether this item is the current page */
  matches(pathname: string): boolean;
}

/** The shell's navigation, in order, for both the bottom bar and the side column. */
export const NAV_ITEMS: readonly NavItem[] = [
  { href: '/', label: 'Overview', Icon: OverviewIcon, testID: 'nav-overview', matches: (p) => p === '/' },
  { href: '/designs', label: 'Designs', Icon: DesignsIcon, testID: 'nav-designs', matches: (p) => p === '/designs' || p.startsWith('/designs/') },
  { href: '/members', label: 'Members', Icon: MembersIcon, testID: 'nav-members', matches: (p) => p === '/members' },
];
