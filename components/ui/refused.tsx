export function Refused({ what }: { what: string }) {
  return (
    <div role="alert" className="mx-auto max-w-lg rounded-lg border border-bad/50 bg-bad/10 p-6 text-center" data-testid="refused">
      <h1 className="text-lg font-semibold">Not for your role</h1>
      <p className="mt-2 text-sm text-muted">{what} is open to other roles only. If you need it, ask an admin.</p>
    </div>
  );
}
