import { useOutletContext } from 'react-router-dom';
import type { MeDto } from '@shared/types/api';
import { TeamPage } from '@/features/team/components/team-page';

export default function TeamRoute() {
  return <TeamPage me={useOutletContext<MeDto>()} />;
}
