import { ImportPage } from '@/features/cartridges/components/import-page';

export default function CartridgeImportRoute() {
  return <ImportPage />;
}
