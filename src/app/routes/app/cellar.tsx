import { CellarPage } from '@/features/cellar/components/cellar-page';

export default function CellarRoute() {
  return <CellarPage />;
}
