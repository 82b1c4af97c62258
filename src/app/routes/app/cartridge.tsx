import { useParams } from 'react-router-dom';
import { HistoryPanel } from '@/features/audit/components/history-panel';
import { CartridgePage } from '@/features/cartridges/components/cartridge-page';

export default function CartridgeRoute() {
  const { cartridgeId = '' } = useParams();
  return (
    <div className="flex flex-col gap-6">
      <CartridgePage key={cartridgeId} id={cartridgeId} />
      <HistoryPanel kind="cartridge" recordId={cartridgeId} />
    </div>
  );
}
