/** The header's sections. A feature adds its entry here when its page exists. */
export interface NavItem {
  href: string;
  label: string;
}

export const NAV_ITEMS: NavItem[] = [{ href: "/", label: "Overview" }];
