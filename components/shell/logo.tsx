/** The Fuelwright word mark: a droplet inside a gauge arc. */
export function Logo({ small = false }: { small?: boolean }) {
  return (
    <span
      className={`inline-flex items-center gap-2 font-display font-bold ${small ? "text-lg" : "text-2xl"}`}
    >
      <svg aria-hidden="true" viewBox="0 0 32 32" className={small ? "h-6 w-6" : "h-8 w-8"}>
        <path
          d="M5 22a11 11 0 1 1 22 0"
          fill="none"
          stroke="#b3592c"
          strokeWidth="3"
          strokeLinecap="round"
        />
        <path d="M16 9c3 4 5 6.5 5 9a5 5 0 0 1-10 0c0-2.5 2-5 5-9z" fill="currentColor" />
      </svg>
      Fuelwright
    </span>
  );
}
