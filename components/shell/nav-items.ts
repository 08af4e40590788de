// The studio's sections, in the order they appear in the bottom bar (phone) and the side rail.
// `path` is appended to /s/:studioId. `icon` names a glyph in nav-icons.tsx.
export interface NavItem {
  path: string;
  label: string;
  icon: "home" | "trials" | "library" | "colourways" | "people" | "activity";
  /** Roles that see the item; all roles when absent. */
  roles?: ("owner" | "dyer" | "guest")[];
}

export const navItems: NavItem[] = [
  { path: "", label: "Home", icon: "home" },
  { path: "/trials", label: "Trials", icon: "trials" },
  { path: "/library", label: "Library", icon: "library" },
  { path: "/colourways", label: "Colourways", icon: "colourways" },
  { path: "/activity", label: "Activity", icon: "activity" },
  { path: "/members", label: "People", icon: "people" },
];
