import { EquipmentPage } from '@/features/equipment/components/equipment-page';

export default function EquipmentRoute() {
  return <EquipmentPage />;
}
