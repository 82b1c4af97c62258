import { useParams } from 'react-router-dom';
import { CartridgePage } from '@/features/cartridges/components/cartridge-page';

export default function CartridgeRoute() {
  const { cartridgeId = '' } = useParams();
  return <CartridgePage key={cartridgeId} id={cartridgeId} />;
}
