import { WaitingPage } from '@/features/offline/components/waiting-page';

export default function WaitingRoute() {
  return <WaitingPage />;
}
