// BrakeModel's handle-body glue and the placement helpers of occt_model.hpp.
#include <TopLoc_Location.hxx>

#include "geometry/occt_model.hpp"

namespace bandforge::geom {

const char* to_string(PartKind kind) {
  switch (kind) {
    case PartKind::drum: return "drum";
    case PartKind::lining: return "lining";
    case PartKind::band: return "band";
    case PartKind::lever: return "lever";
    case PartKind::grip: return "grip";
    case PartKind::pin: return "pin";
    case PartKind::anchor: return "anchor";
    case PartKind::block: return "block";
    case PartKind::washer: return "washer";
    case PartKind::split_pin: return "split-pin";
    case PartKind::sleeve: return "sleeve";
    case PartKind::rivet: return "rivet";
    case PartKind::spring: return "spring";
    case PartKind::seat: return "seat";
    case PartKind::weight: return "weight";
    case PartKind::hanger: return "hanger";
  }
  return "?";
}

BrakeModel::BrakeModel(std::unique_ptr<Impl> impl) : impl_(std::move(impl)) {}
BrakeModel::~BrakeModel() = default;
BrakeModel::BrakeModel(BrakeModel&&) noexcept = default;
BrakeModel& BrakeModel::operator=(BrakeModel&&) noexcept = default;

const std::vector<PartInfo>& BrakeModel::parts() const { return impl_->infos; }
const std::vector<ContactCheck>& BrakeModel::contacts() const { return impl_->contacts; }
bool BrakeModel::all_valid() const { return impl_->valid; }

TopoDS_Shape BrakeModel::Impl::placed_shape(std::size_t instance) const {
  const Instance& in = instances.at(instance);
  return parts.at(in.part).shape.Moved(TopLoc_Location(in.placement));
}

std::vector<BrakeModel::Impl::Placed> BrakeModel::Impl::placed() const {
  std::vector<Placed> out;
  out.reserve(instances.size());
  for (std::size_t i = 0; i < instances.size(); ++i) {
    out.push_back({placed_shape(i), instances[i].part, i});
  }
  return out;
}

std::size_t BrakeModel::Impl::find(PartKind kind) const {
  for (std::size_t i = 0; i < parts.size(); ++i) {
    if (parts[i].kind == kind) return i;
  }
  return parts.size();
}

}  // namespace bandforge::geom
