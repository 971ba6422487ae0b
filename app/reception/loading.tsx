import Loading from '../components/Loading';

export default function ReceptionLoading() {
  return <Loading what="record counts" />;
}
