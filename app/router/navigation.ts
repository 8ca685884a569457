// The drawer's entries: DESIGN.md's screen names, only screens that work today. Which roles see an
// entry is read from the route's own meta, so the drawer and the guard cannot disagree.
import type { Router } from 'vue-router';
import type { Role } from 'shared/roles';
import { rolesAllow } from './guard';

export interface NavItem {
  /** Route name; also the `nav-<name>` test id. */
  name: string;
  label: string;
  icon: string;
}

export interface NavSection {
  /** Heading above the items (none for the main group). */
  title: string | null;
  items: NavItem[];
}

export const NAVIGATION: NavSection[] = [
  {
    title: null,
    items: [
      { name: 'overview', label: 'Overview', icon: 'dashboard' },
      { name: 'sites', label: 'Sites', icon: 'factory' },
      { name: 'motors', label: 'Motor register', icon: 'settings_input_component' },
      { name: 'intake', label: 'Intake', icon: 'upload_file' },
      { name: 'quick-study', label: 'Quick study', icon: 'query_stats' },
      { name: 'screening', label: 'Site screening', icon: 'playlist_add_check' },
      { name: 'bldc-sizing', label: 'BLDC sizing', icon: 'precision_manufacturing' },
      { name: 'cases', label: 'Business cases', icon: 'request_quote' },
      { name: 'retrofits', label: 'Retrofit log', icon: 'construction' },
      { name: 'outbox', label: 'Outbox', icon: 'mail' },
    ],
  },
  {
    title: 'Settings',
    items: [
      { name: 'settings-price-book', label: 'Price book', icon: 'sell' },
      { name: 'settings-assumptions', label: 'Assumptions', icon: 'tune' },
      { name: 'settings-materials', label: 'Materials', icon: 'category' },
      { name: 'team', label: 'Team', icon: 'group' },
    ],
  },
];

/** The sections and items a role may open; empty sections are left out. */
export function navigationFor(router: Router, role: Role): NavSection[] {
  return NAVIGATION.map((section) => ({
    title: section.title,
    items: section.items.filter((item) => rolesAllow(router.resolve({ name: item.name }), role)),
  })).filter((section) => section.items.length > 0);
}
