import { PageSkeleton } from "@/components/ui/card";

export default function Loading() {
  return <PageSkeleton />;
}
