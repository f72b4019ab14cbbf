import type { FloodgatePostView } from '../../../lib/schemas/crossing-view';
import { Facts } from './Facts';
import { formatChainage, formatMetres, formatValue } from './format';
import { Why } from './Why';

/** The posts between the end strainers: counts by kind, then every post with its water and the reasons for it. */
export function LayoutPosts({ posts, heavyPostsReason }: { posts: FloodgatePostView[]; heavyPostsReason: string }) {
  const floodgatePosts = posts.filter((post) => post.role === 'floodgate');
  const stayed = posts.filter((post) => post.braced);
  const open = posts.filter((post) => post.hungDropper?.link === 'open').length;
  const closed = posts.filter((post) => post.hungDropper?.link === 'closed').length;
  return (
    <>
      <h4 className="mt-3 text-sm font-bold">Posts and droppers</h4>
      <Facts
        rows={[
          ['Posts between the end strainers', String(posts.length)],
          ['In the floodgate (heavy)', String(floodgatePosts.length)],
          ['Stayed (deep or fast flow)', String(stayed.length)],
          ['Hung droppers, open link', String(open)],
          ['Hung droppers, closed link', String(closed)],
        ]}
      />
      <Why reasons={[heavyPostsReason]} summary="Every post, and why">
        <ul className="mb-2 list-disc space-y-1 pl-5 text-bark-700">
          {reasonsByPost(posts).map(([reason, chainages]) => (
            <li key={reason}>
              {reason} <span className="text-bark-500">(at {chainages.map((chainageM) => formatChainage(chainageM)).join(', ')})</span>
            </li>
          ))}
        </ul>
        <div className="mb-2 overflow-x-auto">
          <table className="w-full text-left text-xs tabular-nums">
            <thead>
              <tr className="border-b border-sand-300 text-bark-700">
                <th className="py-1 pr-2 font-semibold">Along</th>
                <th className="py-1 pr-2 font-semibold">Post</th>
                <th className="py-1 pr-2 font-semibold">Water</th>
                <th className="py-1 font-semibold">Dropper link</th>
              </tr>
            </thead>
            <tbody>
              {posts.map((post) => (
                <tr key={post.chainageM} className="border-b border-sand-200 align-top" title={post.reasons.join(' ')}>
                  <td className="py-1 pr-2">{formatChainage(post.chainageM)}</td>
                  <td className="py-1 pr-2">
                    {post.role === 'floodgate' ? 'floodgate' : 'line'}
                    {post.braced ? ', stayed' : ''}
                    {post.breakawayTie ? ', tie' : ''}
                  </td>
                  <td className="py-1 pr-2">{post.floodDepthM >= 0.005 ? `${formatMetres(post.floodDepthM, 2)}, ${formatValue(post.velocityMs, 1, 'm/s')}` : 'dry'}</td>
                  <td className="py-1">{post.hungDropper ? post.hungDropper.link : '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </Why>
    </>
  );
}

/** Each distinct reason given for the posts, with the chainages of the posts it applies to. */
function reasonsByPost(posts: FloodgatePostView[]): [string, number[]][] {
  const byReason = new Map<string, number[]>();
  for (const post of posts) {
    for (const reason of [...post.reasons, ...(post.hungDropper ? [post.hungDropper.reason] : [])]) {
      byReason.set(reason, [...(byReason.get(reason) ?? []), post.chainageM]);
    }
  }
  return [...byReason];
}
