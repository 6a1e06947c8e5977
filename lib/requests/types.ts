export type TechniqueRequestResponse = {
  id: string;
  query: string;
  note: string;
  status: "open" | "claimed" | "resolved";
  requester: { id: string; name: string } | null;
  claimedBy: { id: string; name: string } | null;
  createdAt: string;
};
