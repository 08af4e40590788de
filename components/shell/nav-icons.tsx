import type { NavItem } from "./nav-items";

// Simple line glyphs of our own, drawn at 24 px with the current text colour.
const paths: Record<NavItem["icon"], React.ReactNode> = {
  home: <path d="M4 11 12 4l8 7v9h-5v-6H9v6H4z" />,
  trials: (
    <>
      <path d="M9 3h6M10 3v6l-5 9a2 2 0 0 0 2 3h10a2 2 0 0 0 2-3l-5-9V3" />
      <path d="M7.5 15h9" />
    </>
  ),
  library: (
    <>
      <path d="M5 4h4v16H5zM10 4h4v16h-4z" />
      <path d="m15 5 3.5-1 3 15-3.5 1z" />
    </>
  ),
  colourways: (
    <>
      <circle cx="9" cy="10" r="5" />
      <circle cx="15" cy="10" r="5" />
      <circle cx="12" cy="15" r="5" />
    </>
  ),
  people: (
    <>
      <circle cx="9" cy="8" r="3.5" />
      <path d="M3 20c0-3.5 2.7-6 6-6s6 2.5 6 6" />
      <circle cx="17" cy="9" r="2.5" />
      <path d="M16 14c3 0 5 2 5 5" />
    </>
  ),
  activity: <path d="M3 12h4l3-7 4 14 3-7h4" />,
};

export function NavIcon({ icon }: { icon: NavItem["icon"] }) {
  return (
    <svg width="24" height="24" viewBox="0 0 24 24" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinejoin="round" strokeLinecap="round" aria-hidden="true">
      {paths[icon]}
    </svg>
  );
}
