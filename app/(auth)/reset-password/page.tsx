import { ResetPasswordForm } from "./reset-form";

export default async function ResetPasswordPage({
  searchParams,
}: {
  searchParams: Promise<{ token?: string; error?: string }>;
}) {
  const { token, error } = await searchParams;
  return (
    <>
      <h1 className="text-2xl font-bold">Choose a new password</h1>
      {!token || error ? (
        <p className="mt-4 text-danger-700">
          ✕ This reset link is not valid any more. Ask for a new one.
        </p>
      ) : (
        <ResetPasswordForm token={token} />
      )}
    </>
  );
}
