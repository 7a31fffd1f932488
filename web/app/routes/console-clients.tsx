import { Page } from '../../components/page';

export function ConsoleClientsRoute() {
  return <Page title="Clients">{null}</Page>;
}
