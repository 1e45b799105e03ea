import { LoadingState } from '@/components/layout/loading-state';

export default function Loading() {
  return <LoadingState />;
}
