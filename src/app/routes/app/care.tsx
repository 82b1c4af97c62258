import { CarePage } from '@/features/care/components/care-page';

export default function CareRoute() {
  return <CarePage />;
}
