import { Link } from 'react-router';
import { paths } from '../paths';

export function Component() {
  return (
    <div className="py-16 text-center">
      <h1 className="text-xl font-semibold">No such page</h1>
      <Link to={paths.planner} className="mt-3 inline-block text-moss underline">Go to the planner</Link>
    </div>
  );
}
