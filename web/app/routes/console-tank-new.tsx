import { Link, useNavigate } from 'react-router';
import { Page } from '../../components/page';
import { useCreateTank } from '../../features/tanks/api/create-tank';
import { TankForm } from '../../features/tanks/components/tank-form';

export function ConsoleTankNewRoute() {
  const navigate = useNavigate();
  const createTank = useCreateTank();
  return (
    <Page
      title="New tank"
      description={
        <Link to="/console" className="font-bold text-brine-700">
          Back to clients and tanks
        </Link>
      }
    >
      <TankForm
        submitLabel="Create tank"
        onSubmit={async (input) => {
          const tank = await createTank.mutateAsync(input);
          await navigate(`/console/tanks/${tank.id}/edit?created=1`);
        }}
      />
    </Page>
  );
}
