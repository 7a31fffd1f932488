import { Page } from '../../components/page';

export function ConsoleStaffRoute() {
  return <Page title="Staff">{null}</Page>;
}
