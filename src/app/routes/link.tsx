import { useEffect, useRef } from 'react';
import { Link, useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { Card } from '../../components/ui/card';
import { Notice } from '../../components/ui/notice';
import { useRedeemSignInLink } from '../../features/auth/api/redeem-sign-in-link';
import { SignInLinkForm } from '../../features/auth/components/sign-in-link-form';
import { PublicFrame } from './public-frame';

/**
 * Opening a sitter's link signs them in. The link is redeemed by a POST from the page,
 * not by the GET itself, so mail scanners that fetch links do not use it up.
 */
export function LinkPage() {
  const { token = '' } = useParams();
  const navigate = useNavigate();
  const [search] = useSearchParams();
  // Only a path of this site: never another origin (//host) or a scheme.
  const requested = search.get('next') ?? '';
  const next = /^\/(?!\/)[A-Za-z0-9/_-]*$/.test(requested) ? requested : '/';
  const redeem = useRedeemSignInLink();
  const started = useRef(false);

  useEffect(() => {
    if (started.current) return;
    started.current = true;
    redeem.mutate(token, { onSuccess: () => navigate(next, { replace: true }) });
  }, [token, redeem, navigate, next]);

  return (
    <PublicFrame title={redeem.isError ? 'This link cannot sign you in' : 'Signing you in'}>
      {redeem.isError ? (
        <>
          <Notice tone="danger">{redeem.error.message}</Notice>
          <Card title="Get a fresh link">
            <SignInLinkForm />
          </Card>
          <Link to="/sign-in" className="font-medium text-spruce-700 underline">
            Back to sign-in
          </Link>
        </>
      ) : (
        <p className="text-ink-muted" role="status">
          Checking your link…
        </p>
      )}
    </PublicFrame>
  );
}
