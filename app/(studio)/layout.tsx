export default function StudioGroupLayout({ children }: { children: React.ReactNode }) {
  return <>{children}</>;
}
