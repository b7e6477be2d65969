import { useCurrentUser } from '@/features/auth/components/current-user';
import { AdminHome } from './admin-home';
import { GrowerHome } from './grower-home';
import { ManagerHome } from './manager-home';
import { SpecialistHome } from './specialist-home';

/** Home is a different page for each role: the view that role starts its day with. */
export function HomePage() {
  const user = useCurrentUser();
  switch (user.role) {
    case 'admin':
      return <AdminHome />;
    case 'manager':
      return <ManagerHome />;
    case 'specialist':
      return <SpecialistHome />;
    case 'grower':
      return <GrowerHome />;
  }
}
