import Loading from '../components/Loading';

export default function WatchlistLoading() {
  return <Loading what="the flags" />;
}
