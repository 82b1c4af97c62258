import { useOutletContext } from 'react-router-dom';
import type { MeDto } from '@shared/types/api';
import { SettingsPage } from '@/features/settings/components/settings-page';

export default function SettingsRoute() {
  return <SettingsPage me={useOutletContext<MeDto>()} />;
}
