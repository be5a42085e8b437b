import type { ButtonHTMLAttributes } from "react";

const styles = {
  primary: "bg-copper-600 text-white hover:bg-copper-700 disabled:bg-ink-300",
  secondary: "border border-ink-300 bg-white text-ink-800 hover:bg-ink-100",
  danger: "bg-danger-600 text-white hover:bg-danger-700",
  ghost: "text-ink-700 hover:bg-ink-100",
} as const;

export function Button({
  variant = "primary",
  className = "",
  ...rest
}: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: keyof typeof styles }) {
  return (
    <button
      className={`inline-flex min-h-10 items-center justify-center gap-2 rounded-md px-4 py-2 text-sm font-semibold transition-colors disabled:cursor-not-allowed ${styles[variant]} ${className}`}
      {...rest}
    />
  );
}

/**
 * A button that reads as a link: an action in running text or a tight table cell ("remove",
 * "Try again"). It still is a button — it acts on this page and never navigates.
 */
export function LinkButton({
  className = "",
  type = "button",
  ...rest
}: ButtonHTMLAttributes<HTMLButtonElement>) {
  return (
    <button
      type={type}
      className={`rounded-sm font-medium text-copper-700 underline underline-offset-2 hover:text-copper-600 disabled:cursor-not-allowed disabled:text-ink-400 disabled:no-underline ${className}`}
      {...rest}
    />
  );
}
