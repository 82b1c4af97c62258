import { CartridgesPage } from '@/features/cartridges/components/cartridges-page';

export default function CartridgesRoute() {
  return <CartridgesPage />;
}
