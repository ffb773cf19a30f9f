import { Link } from 'react-router-dom';

/** Where a mail page sits: "Mail deliveries › …", as a breadcrumb trail (a plain list of links). */
export function Trail({ here }: { here: string }) {
  return (
    <nav aria-label="Breadcrumb" className="cairn-mail-trail">
      <ol>
        <li>
          <Link to="/deliveries">Mail deliveries</Link>
        </li>
        <li aria-current="page">{here}</li>
      </ol>
    </nav>
  );
}
